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
    /** The user's session version when this cookie was issued; a higher one in the database ends it. */
    sessionVersion?: number
  }
}

export {}
