export * from './organizations'
export * from './users'
export * from './audit'
