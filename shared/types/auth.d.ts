// Session shape shared by the app and the server (nuxt-auth-utils).
declare module '#auth-utils' {
  interface User {
    id: string
    email: string
    name: string
  }
  interface UserSession {
    // server-side session record id; checked on every request so a session can be revoked
    sid: string
  }
}
export {}
