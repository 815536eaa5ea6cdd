import type { Role } from '../utils/roles'

declare module '#auth-utils' {
  interface User {
    id: string
    organizationId: string
    role: Role
    email: string
    displayName: string
  }
  interface UserSession {
    signedInAt?: string
  }
}

export {}
