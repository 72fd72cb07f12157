import path from 'node:path'
import { buildWorker } from './scripts/build-worker'

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
    // Stripe and SMTP: the real SDKs; local fakes or the real services by configuration alone
    // (NUXT_STRIPE_SECRET_KEY, NUXT_STRIPE_HOST/PORT/PROTOCOL (empty = api.stripe.com), NUXT_STRIPE_WEBHOOK_SECRET,
    // NUXT_SMTP_HOST/PORT/SECURE/USER/PASS, NUXT_MAIL_FROM)
    stripeSecretKey: '',
    stripeHost: '',
    stripePort: '',
    stripeProtocol: '',
    stripeWebhookSecret: '',
    smtpHost: '',
    smtpPort: '',
    smtpSecure: false,
    smtpUser: '',
    smtpPass: '',
    mailFrom: 'Knotwork <no-reply@knotwork.example>',
    // NUXT_SIGNING_SECRET (scripts/env.sh sets it from KW_SIGNING_SECRET): seals each organisation's Ed25519 private key
    signingSecret: '',
    session: {
      name: 'knotwork-session',
      maxAge: 60 * 60 * 12,
      cookie: { sameSite: 'lax' },
    },
    public: {
      // NUXT_PUBLIC_BASE_URL: origin used for links in e-mails; NUXT_PUBLIC_MAIL_INBOX_URL: the local mail fake's inbox page
      baseUrl: 'http://127.0.0.1:3000',
      mailInboxUrl: '',
    },
  },
  nitro: {
    preset: 'node-server',
    // exceljs pulls these in through the `module-sync` export condition, which a build on Node 20
    // does not trace (nitrojs/nitro#4468): without them the built server fails on the first import.
    externals: {
      traceInclude: [
        'node_modules/async-function/require.mjs',
        'node_modules/async-generator-function/require.mjs',
        'node_modules/generator-function/require.mjs',
      ],
    },
  },
  vite: {
    optimizeDeps: { include: [] },
  },
  hooks: {
    // The worker threads run their own bundle (server/lib/work/worker.ts, see DEVELOPERS.md "Worker threads"): written
    // beside the server Nitro has just compiled (.output/server/workers/; in dev under .nuxt/), where pool.ts looks.
    'nitro:init'(nitro) {
      nitro.hooks.hook('compiled', async () => {
        await buildWorker(path.join(nitro.options.output.serverDir, 'workers'), { minify: !nitro.options.dev })
      })
    },
  },
})
