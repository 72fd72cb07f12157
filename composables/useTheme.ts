// Light, dark or the system's setting: the choice lives in a cookie (so the server renders <html class="dark"> and
// nothing flashes) and in localStorage (kept when the cookie is cleared); plugins/theme.ts applies it.
export const THEME_CHOICES = ['system', 'light', 'dark'] as const
export type ThemeChoice = typeof THEME_CHOICES[number]
export const THEME_KEY = 'kw-theme'

export function useTheme() {
  // no default: a page never sets the cookie until someone chooses
  const cookie = useCookie<ThemeChoice | undefined>(THEME_KEY, { maxAge: 400 * 24 * 3600, sameSite: 'lax', path: '/' })
  const systemDark = useState('kw-system-dark', () => false)
  const choice = computed<ThemeChoice>(() => cookie.value && THEME_CHOICES.includes(cookie.value) ? cookie.value : 'system')
  const dark = computed(() => choice.value === 'dark' || (choice.value === 'system' && systemDark.value))
  function choose(next: ThemeChoice) {
    cookie.value = next
    if (import.meta.client) localStorage.setItem(THEME_KEY, next)
  }
  return { choice, dark, systemDark, choose }
}
