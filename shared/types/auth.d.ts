import type { Role } from '../roles'

declare module '#auth-utils' {
  interface User {
    id: string
    name: string
    email: string
    role: Role
    verified: boolean
  }
}

export {}
