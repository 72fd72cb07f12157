import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { buildWorker } from './scripts/build-worker'

// Knotwork: Nuxt 4 with the classic root layout (srcDir pinned, see DEVELOPERS.md).
const NOTHING_RUNS = "default-src 'none'; frame-ancestors 'none'"

export default defineNuxtConfig({
  compatibilityDate: '2026-11-01',
  srcDir: '.',
  devtools: { enabled: false },
  telemetry: false,
  modules: ['@pinia/nuxt', '@nuxtjs/tailwindcss', 'nuxt-auth-utils', 'nuxt-security'],
  // The app reads sessions only on the server (server/utils/session.ts): no client session plugin, and nuxt-auth-utils'
  // own /api/_auth/session routes are dropped below (its DELETE ended the cookie without ending the server session).
  auth: { loadStrategy: 'none' },
  hooks: {
    'nitro:config'(config) {
      config.handlers = config.handlers?.filter(handler => handler.route !== '/api/_auth/session')
    },
  },
  // Security headers on every response (nuxt-security 2.5.1, the newest that runs on Node 20; docs/security.md).
  // HSTS is added per request only over HTTPS (server/plugins/https-headers.ts). Request limits and throttles are ours:
  // its size limiter trusts Content-Length, its rate limiter counts in one process's memory, its XSS filter is a blocklist.
  security: {
    nonce: true,
    removeLoggers: false,
    headers: {
      contentSecurityPolicy: {
        'default-src': ["'self'"],
        'base-uri': ["'none'"],
        'object-src': ["'none'"],
        'frame-ancestors': ["'none'"],
        'frame-src': ["'none'"],
        'form-action': ["'self'"],
        // Nuxt's inline state and entry scripts carry the per-response nonce; the chunks they import inherit trust
        'script-src': ["'self'", "'nonce-{{nonce}}'", "'strict-dynamic'"],
        'script-src-attr': ["'none'"],
        // <style> elements need the nonce; style attributes (Vue :style bindings, chart tooltips) are allowed
        'style-src': ["'self'", "'nonce-{{nonce}}'"],
        'style-src-elem': ["'self'", "'nonce-{{nonce}}'"],
        'style-src-attr': ["'unsafe-inline'"],
        'img-src': ["'self'", 'data:'],
        'font-src': ["'self'"],
        'connect-src': ["'self'"],
        'worker-src': ["'self'"],
        'manifest-src': ["'self'"],
        'upgrade-insecure-requests': false,
      },
      crossOriginEmbedderPolicy: 'credentialless',
      crossOriginOpenerPolicy: 'same-origin',
      crossOriginResourcePolicy: 'same-origin',
      // no URL of ours (table and version ids) leaves for another site; same-origin requests keep their referrer
      referrerPolicy: 'same-origin',
      strictTransportSecurity: false,
      xContentTypeOptions: 'nosniff',
      xFrameOptions: 'DENY',
      permissionsPolicy: {
        'accelerometer': [], 'autoplay': [], 'camera': [], 'display-capture': [], 'encrypted-media': [], 'fullscreen': [],
        'geolocation': [], 'gyroscope': [], 'magnetometer': [], 'microphone': [], 'midi': [], 'payment': [],
        'picture-in-picture': [], 'publickey-credentials-get': [], 'screen-wake-lock': [], 'usb': [], 'web-share': [],
        'xr-spatial-tracking': [],
      },
    },
    hidePoweredBy: true,
    requestSizeLimiter: false,
    rateLimiter: false,
    xssValidator: false,
    corsHandler: false,
  },
  routeRules: {
    // JSON, files from the API and static files: nothing in them may run, load or be framed (pages get the policy above)
    '/api/**': { headers: { 'content-security-policy': NOTHING_RUNS, 'cross-origin-resource-policy': 'same-origin' } },
    '/_nuxt/**': { headers: { 'content-security-policy': NOTHING_RUNS } },
    '/demo/**': { headers: { 'content-security-policy': NOTHING_RUNS } },
    '/favicon.svg': { headers: { 'content-security-policy': NOTHING_RUNS } },
  },
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
    // NUXT_TRUST_PROXY=1: take the client address from X-Forwarded-For and the scheme from X-Forwarded-Proto (behind a
    // proxy, and in tests)
    trustProxy: false,
    // NUXT_ALLOWED_ORIGINS: more origins (comma-separated) the app is served from, beside NUXT_PUBLIC_BASE_URL; changes
    // from any other origin are refused (server/middleware/01.same-origin.ts)
    allowedOrigins: '',
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
      // NUXT_PUBLIC_BASE_URL: the address people open (links in e-mails; the origin changes must come from);
      // NUXT_PUBLIC_MAIL_INBOX_URL: the local mail fake's inbox page
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
    // Our error handler runs first (an unreachable database becomes 503), then Nuxt's own (JSON or the error page).
    'nitro:config'(config) {
      const ours = fileURLToPath(new URL('./server/error-handlers/database-unavailable.ts', import.meta.url))
      const theirs = config.errorHandler ? [config.errorHandler].flat() : []
      config.errorHandler = [ours, ...theirs]
    },
    // The worker threads run their own bundle (server/lib/work/worker.ts, see DEVELOPERS.md "Worker threads"): written
    // beside the server Nitro has just compiled (.output/server/workers/; in dev under .nuxt/), where pool.ts looks.
    'nitro:init'(nitro) {
      nitro.hooks.hook('compiled', async () => {
        await buildWorker(path.join(nitro.options.output.serverDir, 'workers'), { minify: !nitro.options.dev })
      })
    },
  },
})
