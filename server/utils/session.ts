import type { H3Event } from 'h3'
import type { User, UserSession } from '#auth-utils'

// The sealed session cookie (nuxt-auth-utils, iron-webcrypto), read and written only here.
// - Reading never creates a session. h3's useSession, which getUserSession calls, answers a request that carries no
//   cookie with a fresh empty one: a cross-site form post (the browser withholds the Lax cookie) then replaced the
//   victim's cookie and signed them out, and every anonymous 401 set a cookie. readSession unseals the cookie itself.
// - Over HTTPS the cookie is named `__Host-knotwork-session`: the prefix makes the browser accept it only with Secure,
//   Path=/ and no Domain, so no subdomain or plain-HTTP page can plant or overwrite it. Over http://127.0.0.1 (dev,
//   tests) the plain name is used, because the browser refuses `__Host-` cookies from an insecure origin.

/** True when the request reached us over HTTPS (X-Forwarded-Proto is believed only with NUXT_TRUST_PROXY). */
export function servedOverHttps(event: H3Event): boolean {
  return getRequestProtocol(event, { xForwardedProto: !!useRuntimeConfig(event).trustProxy }) === 'https'
}

export function sessionCookieName(event: H3Event): string {
  const base = String(useRuntimeConfig(event).session.name || 'knotwork-session')
  return servedOverHttps(event) ? `__Host-${base}` : base
}

/** The session sealed in this request's cookie, or null when there is none or it does not unseal. Sets no cookie. */
export async function readSession(event: H3Event): Promise<Partial<Pick<UserSession, 'sid'>> & { user?: User } | null> {
  const name = sessionCookieName(event)
  const sealed = getCookie(event, name)
  if (!sealed) return null
  const config = useRuntimeConfig(event).session
  try {
    const password = String(config.password || process.env.NUXT_SESSION_PASSWORD || '')
    const session = await unsealSession(event, { name, password, maxAge: Number(config.maxAge) || undefined }, sealed)
    return (session.data as UserSession | undefined) ?? null
  } catch {
    return null // tampered, sealed with another password, or older than maxAge
  }
}

/** Seals a fresh session (a new cookie) for a person who has just proved who they are. */
export async function writeSession(event: H3Event, data: { user: User; sid: string }): Promise<void> {
  await replaceUserSession(event, data, { name: sessionCookieName(event) })
}

/** Deletes the cookie (sign-out); a request without one is answered without a cookie. */
export async function endSession(event: H3Event): Promise<void> {
  const name = sessionCookieName(event)
  if (getCookie(event, name)) await clearUserSession(event, { name })
}
