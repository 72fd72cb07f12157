/** The app's client for /api/ (plugins/api.ts): `$fetch` with the ended-session redirect; `.raw` for downloads. */
export function useApi() {
  return useNuxtApp().$api
}
