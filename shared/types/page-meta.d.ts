import type { Permission } from '../permissions'

declare module '#app' {
  interface PageMeta {
    public?: boolean
    permission?: Permission
  }
}
export {}
