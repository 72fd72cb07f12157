import type { AuthUser, OrgAccess } from '../utils/auth'

declare module 'h3' {
  interface H3EventContext {
    requestId?: string
    auth?: { user: AuthUser; sessionId: string }
    access?: OrgAccess
  }
}
export {}
