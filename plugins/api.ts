import type { Pinia } from 'pinia'
import type { ApiErrorCode } from '#shared/api-errors'

// The app's one client for /api/: `useApi()` (composables/useApi.ts) for calls, `useApiFetch()` for page data.
// During server rendering it goes through the page request's own event (its cookie and headers, as Nuxt's
// useRequestFetch does); in the browser the request carries the page's origin, which the CSRF rule asks for.
// A session that has ended (401 sign-in-required / session-ended while someone was signed in) sends the person to the
// sign-in page with the way back; every other refusal stays with the caller (apiErrorCode / apiErrorMessage).
const SESSION_GONE: ApiErrorCode[] = ['sign-in-required', 'session-ended']

// ofetch's create takes the fetch to build on as its second argument (Nitro's typing of $fetch leaves it out)
type Create = (defaults: Parameters<typeof $fetch.create>[0], globals: { fetch?: typeof globalThis.fetch }) => ReturnType<typeof $fetch.create>

export default defineNuxtPlugin((nuxtApp) => {
  const event = import.meta.server ? useRequestEvent() : undefined
  const router = useRouter()
  const api = ($fetch.create as Create)({
    async onResponseError({ response }) {
      if (import.meta.server || response.status !== 401) return
      const workspace = useWorkspaceStore(nuxtApp.$pinia as Pinia)
      if (!SESSION_GONE.includes(response._data?.data?.code) || !workspace.me) return
      workspace.set(null)
      const back = router.currentRoute.value.fullPath
      await nuxtApp.runWithContext(() => navigateTo({ path: '/signin', query: back !== '/' ? { next: back } : {} }))
    },
  }, event
    // h3's event.fetch spreads plain headers only: hand it ofetch's Headers as an object
    ? { fetch: (request, init) => event.fetch(request as string, { ...init, headers: Object.fromEntries(new Headers(init?.headers)) }) }
    : {})
  return { provide: { api } }
})
