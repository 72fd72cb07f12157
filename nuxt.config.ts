// Knotwork: Nuxt 4 with the classic root layout (srcDir pinned, see DEVELOPERS.md).
export default defineNuxtConfig({
  compatibilityDate: '2026-11-01',
  srcDir: '.',
  devtools: { enabled: false },
  telemetry: false,
  modules: ['@pinia/nuxt', '@nuxtjs/tailwindcss', 'nuxt-auth-utils'],
  css: [
    '@fontsource/source-sans-3/400.css',
    '@fontsource/source-sans-3/400-italic.css',
    '@fontsource/source-sans-3/600.css',
    '@fontsource/source-sans-3/700.css',
    '@fontsource/ibm-plex-mono/400.css',
    '@fontsource/ibm-plex-mono/500.css',
  ],
  tailwindcss: { cssPath: '~/assets/css/tailwind.css', viewer: false },
  typescript: {
    strict: true,
    typeCheck: false,
    // node-side tools are checked by tsconfig.tools.json
    tsConfig: { exclude: ['../fakes', '../scripts', '../tests', '../bench'] },
  },
  app: {
    head: {
      htmlAttrs: { lang: 'en-GB' },
      title: 'Knotwork',
      meta: [{ name: 'viewport', content: 'width=device-width, initial-scale=1' }],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  runtimeConfig: {
    // NUXT_DATABASE_URL: the app's own PostgreSQL role (no UPDATE/DELETE on audit rows)
    databaseUrl: '',
    // NUXT_TRUST_PROXY=1: take the client address from X-Forwarded-For (behind a proxy, and in tests)
    trustProxy: false,
    session: {
      name: 'knotwork-session',
      maxAge: 60 * 60 * 12,
      cookie: { sameSite: 'lax' },
    },
  },
  nitro: {
    preset: 'node-server',
  },
  vite: {
    optimizeDeps: { include: [] },
  },
})
