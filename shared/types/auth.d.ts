import type { Role } from '../roles'

declare module '#auth-utils' {
  interface User {
    id: string
    name: string
    email: string
    role: Role
    verified: boolean
  }
  interface UserSession {
    /** The user_sessions row this cookie belongs to; the session ends when the row is gone. */
    sid?: string
    loggedInAt?: string
  }
}

export {}
