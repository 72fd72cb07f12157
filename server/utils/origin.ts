import type { H3Event } from 'h3'

// Which origins are the app's own. The public base URL (NUXT_PUBLIC_BASE_URL, also used for links in e-mails) is the
// address people open, so it is the origin their browser names; NUXT_ALLOWED_ORIGINS (comma-separated) adds more when
// the app is served under several names. Never derived from the request's Host: behind a proxy that header names the
// proxy's upstream, and a request cannot vouch for itself.

/** "scheme://host[:port]" as browsers send it in Origin (lower-case host, default port dropped), or null. */
export function normaliseOrigin(value: string): string | null {
  try {
    const url = new URL(value.trim())
    return url.protocol === 'http:' || url.protocol === 'https:' ? url.origin : null
  } catch {
    return null
  }
}

let memo: { key: string; origins: Set<string> } | undefined
export function appOrigins(event?: H3Event): Set<string> {
  const config = useRuntimeConfig(event)
  const key = `${config.public.baseUrl}|${config.allowedOrigins}`
  if (memo?.key !== key) {
    const listed = [String(config.public.baseUrl), ...String(config.allowedOrigins || '').split(',')]
    memo = { key, origins: new Set(listed.map(normaliseOrigin).filter((o): o is string => !!o)) }
  }
  return memo.origins
}

/**
 * True when the browser says the request comes from one of the app's own pages: its Origin header is one of ours, or,
 * when it sends no usable Origin (absent, or "null" from a privacy-sensitive context), its Sec-Fetch-Site is
 * "same-origin". Both headers are set by the browser and cannot be changed by a page's script.
 */
export function provesSameOrigin(event: H3Event): boolean {
  const origin = getRequestHeader(event, 'origin')
  if (origin && origin !== 'null') {
    const normal = normaliseOrigin(origin)
    return !!normal && appOrigins(event).has(normal)
  }
  return getRequestHeader(event, 'sec-fetch-site') === 'same-origin'
}
