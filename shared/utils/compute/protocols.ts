// Protocols, in three files: protocol-data.ts (the types and the built-in protocols),
// protocol-timeline.ts (where each phase starts and ends) and protocol-schema.ts (the zod schema
// for a custom protocol an admin adds). This file is their public face.
export * from './protocol-data'
export * from './protocol-timeline'
export * from './protocol-schema'
