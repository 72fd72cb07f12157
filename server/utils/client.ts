import type { H3Event } from 'h3'

/** The caller's address; X-Forwarded-For is trusted only when NUXT_TRUST_PROXY is set. */
export function clientAddress(event: H3Event): string {
  return getRequestIP(event, { xForwardedFor: !!useRuntimeConfig().trustProxy }) ?? 'unknown'
}
