import { createRequire } from 'node:module'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'

// Nuxt adds its own error handler (the one that renders app/error.vue for a page URL) only when no
// other is configured; ours runs first for the API and the database, then Nuxt's renders the page.
const requireFromNuxt = createRequire(createRequire(import.meta.url).resolve('nuxt/package.json'))
const nuxtPageErrorHandler = join(dirname(requireFromNuxt.resolve('@nuxt/nitro-server')), 'runtime/handlers/error')

// Sealwright: Nuxt 4 app with `app/` as srcDir, server routes under `server/`, pure computation in `shared/`.
export default defineNuxtConfig({
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-auth-utils', '@nuxt/eslint', 'nuxt-security'],
  devtools: { enabled: false },
  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      title: 'Sealwright',
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1' },
        { name: 'description', content: 'Readiness checks, headform tests and quantitative fit tests for respiratory-protection programs.' }
      ],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }]
    }
  },
  css: [
    '@fontsource/ibm-plex-sans/latin-400.css',
    '@fontsource/ibm-plex-sans/latin-500.css',
    '@fontsource/ibm-plex-sans/latin-600.css',
    '@fontsource/ibm-plex-sans/latin-700.css',
    '~/assets/css/main.css'
  ],
  runtimeConfig: {
    databaseUrl: '',
    // Trust X-Forwarded-For only behind a known proxy; it decides which address sign-in throttling counts.
    trustProxy: false,
    // Start the pg-boss queue that runs the daily reminders (NUXT_REMINDER_QUEUE=false turns it off).
    reminderQueue: true,
    session: {
      name: 'sealwright-session',
      maxAge: 60 * 60 * 12
    },
    mail: {
      smtpUrl: 'smtp://127.0.0.1:2525',
      from: 'Sealwright <no-reply@sealwright.example>',
      // The local fake SMTP server's read-back address; empty in production, where there is no outbox page.
      outboxUrl: ''
    },
    public: {
      baseUrl: 'http://127.0.0.1:3000'
    }
  },
  // An API answer is JSON, never a page that runs scripts: no CSP nonce is made for it (the page
  // renderer still makes one per page).
  routeRules: {
    '/api/**': { security: { nonce: false } }
  },
  experimental: {
    // A link fetches its page's code when a pointer rests on it or it takes focus, not as soon as it
    // scrolls into view: the side panel links to every area, and fetching them all made each first
    // load carry the code of a dozen pages nobody had opened (the calculator's unit library among them).
    defaults: { nuxtLink: { prefetchOn: { visibility: false, interaction: true } } }
  },
  compatibilityDate: '2026-11-01',
  nitro: {
    errorHandler: ['~~/server/error-handler.ts', nuxtPageErrorHandler],
    // Lets the database layer know which request sent a statement (see server/utils/db-outcome.ts).
    experimental: { asyncContext: true },
    // Built assets ship with .gz and .br copies, served to clients that accept them; pages and API
    // answers are gzipped as they are sent (server/plugins/compression.ts).
    compressPublicAssets: { gzip: true, brotli: true },
    // The fit card PDF embeds the same IBM Plex Sans the pages use, shipped with the server.
    serverAssets: [{
      baseName: 'fonts',
      dir: fileURLToPath(new URL('./node_modules/@fontsource/ibm-plex-sans/files', import.meta.url)),
      pattern: 'ibm-plex-sans-latin-{400,600}-normal.woff'
    }]
  },
  typescript: {
    strict: true
  },
  // A server render reads the session from its own request (server/middleware/page-start.ts and
  // app/plugins/00.page-start.server.ts) instead of asking the module's session route.
  auth: {
    loadStrategy: 'none'
  },
  eslint: {
    config: {
      stylistic: {
        quotes: 'single',
        commaDangle: 'never',
        braceStyle: '1tbs'
      }
    }
  },
  // Response headers and the Content-Security-Policy. Body limits and the cross-site check live in
  // server/middleware/request-guard.ts (they answer with a sentence); sign-in limits in
  // server/utils/limiter.ts (shared through PostgreSQL), so the module's own versions are off.
  security: {
    nonce: true,
    headers: {
      contentSecurityPolicy: {
        'default-src': ['\'self\''],
        'base-uri': ['\'none\''],
        'object-src': ['\'none\''],
        'frame-ancestors': ['\'none\''],
        'form-action': ['\'self\''],
        'script-src': ['\'self\'', '\'nonce-{{nonce}}\'', '\'strict-dynamic\''],
        'script-src-attr': ['\'none\''],
        // Vue writes style attributes during rendering; no style is ever built from what a user typed.
        'style-src': ['\'self\'', '\'unsafe-inline\''],
        'img-src': ['\'self\'', 'data:', 'blob:'],
        'font-src': ['\'self\'', 'data:'],
        'connect-src': ['\'self\''],
        'worker-src': ['\'self\'', 'blob:'],
        'frame-src': ['\'self\'', 'blob:'],
        'upgrade-insecure-requests': false
      },
      xFrameOptions: 'DENY',
      xContentTypeOptions: 'nosniff',
      referrerPolicy: 'strict-origin-when-cross-origin',
      crossOriginEmbedderPolicy: false,
      // Served over plain http on loopback in development; a TLS proxy in front sets HSTS itself.
      strictTransportSecurity: false,
      permissionsPolicy: { camera: [], microphone: [], geolocation: [], fullscreen: ['self'] }
    },
    hidePoweredBy: true,
    requestSizeLimiter: false,
    rateLimiter: false,
    xssValidator: false,
    corsHandler: false,
    allowedMethodsRestricter: false,
    removeLoggers: false
  },
  tailwindcss: {
    cssPath: '~/assets/css/main.css',
    viewer: false
  }
})
