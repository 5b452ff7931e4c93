import type { Role, OrgKind } from './accounts'

declare module '#auth-utils' {
  interface User {
    id: number
    name: string
    role: Role
    organisationId: number
    organisationKind: OrgKind
  }
  interface UserSession {
    /** our own random session id; the server-side record decides whether the cookie still counts */
    sid: string
  }
}
export {}
