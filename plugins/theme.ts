// Puts the theme choice on <html> (class "light" / "dark", none for the system's) and the color-scheme meta, on the
// server from the cookie, so the first paint is right without an inline script (the CSP has a nonce); in the browser
// it follows the system setting for the charts (composables/useTheme.ts).
export default defineNuxtPlugin(() => {
  const { choice, systemDark, choose } = useTheme()
  useHead({
    htmlAttrs: { class: computed(() => choice.value === 'system' ? undefined : choice.value) },
    meta: [{ name: 'color-scheme', content: computed(() => choice.value === 'system' ? 'light dark' : choice.value) }],
  })
  if (import.meta.client) {
    const stored = localStorage.getItem(THEME_KEY)
    if (!document.cookie.split('; ').some(c => c.startsWith(`${THEME_KEY}=`)) && (stored === 'light' || stored === 'dark')) choose(stored)
    const query = window.matchMedia('(prefers-color-scheme: dark)')
    systemDark.value = query.matches
    query.addEventListener('change', (e) => { systemDark.value = e.matches })
  }
})
