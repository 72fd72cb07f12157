import type { UseFetchOptions } from '#app'

/** `useFetch` through the app's client (plugins/api.ts): page data with an explicit key, refreshed after writes. */
export function useApiFetch<T>(url: string | Ref<string> | (() => string), options: UseFetchOptions<T> = {}) {
  return useFetch(url, { ...options, $fetch: useApi() as typeof $fetch })
}
