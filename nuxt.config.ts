// Boreline: Nuxt 4 application config. Runtime values come from NUXT_* environment variables
// (see .env.example); nothing here fetches anything from outside the machine at run time.
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { SCRYPT_OPTIONS } from './server/services/password'

const buildDir = process.env.BORELINE_BUILD_DIR // lets parallel work trees build side by side

export default defineNuxtConfig({
  compatibilityDate: '2026-11-01',
  devtools: { enabled: false },
  telemetry: false,
  modules: ['@pinia/nuxt', '@nuxtjs/tailwindcss', 'nuxt-auth-utils', '@vueuse/nuxt', '@nuxt/eslint', 'nuxt-security'],
  css: ['~/assets/css/main.css'],
  // font files are never inlined as data: URLs (Vite inlines assets under 4 KB, such as the small subsets of the
  // shipped fonts): the content security policy allows fonts from this server only ('self')
  vite: { build: { assetsInlineLimit: (file: string) => (/\.(woff2?|ttf|otf)$/i.test(file) ? false : undefined) } },
  // components are named by file (app/components/quotes/QuoteCard.vue -> <QuoteCard>), folders show the domain
  components: [{ path: '~/components', pathPrefix: false }],
  ...(buildDir ? { buildDir: `${buildDir}/.nuxt` } : {}),
  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      title: 'Boreline',
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/boreline-mark.svg' }],
      meta: [{ name: 'viewport', content: 'width=device-width, initial-scale=1' }],
    },
  },
  runtimeConfig: {
    // server-only; every key can be overridden as NUXT_<SNAKE_CASE>
    databaseUrl: 'sqlite:./data/boreline.sqlite',
    publicOrigin: 'http://localhost:3000',
    uploadsDir: './uploads',
    smtpHost: '127.0.0.1',
    smtpPort: 1025,
    mailFrom: 'Boreline <no-reply@boreline.test>',
    stripeSecretKey: 'sk_test_boreline_local',
    stripeWebhookSecret: 'whsec_boreline_local_secret',
    stripeHost: '127.0.0.1',
    stripePort: 12111,
    stripeProtocol: 'http',
    // the hosted vehicle-data service (registration look-ups); the demo points at fakes/vehicle-data
    vehicleDataProtocol: 'http',
    vehicleDataHost: '127.0.0.1',
    vehicleDataPort: 12112,
    vehicleDataKey: 'vd_test_boreline_local',
    vehicleDataTimeoutMs: 4000,
    sessionIdleMinutes: 60,
    sessionAbsoluteHours: 12,
    // how long an unpaid card order holds its stock, and its checkout stays open (the payment service's minimum is 30)
    orderHoldMinutes: 30,
    session: {
      name: 'boreline-session',
      password: '',
      cookie: { sameSite: 'lax', httpOnly: true },
      // never accept the session from a request header (h3 would otherwise read x-nuxt-session-*)
      sessionHeader: false,
    },
    public: {
      currency: 'GBP',
      locale: 'en-GB',
      // the one zone for dates on screens, documents, statements and e-mails
      timeZone: 'Europe/London',
      // the national registration format whose age identifier narrows the year ('uk' or 'none')
      registrationFormat: 'uk',
    },
  },
  nitro: {
    externals: {
      external: ['sqlite3', 'sequelize'],
      // @noble/hashes is installed twice (pdfkit and formidable use 1.x, otplib 2.x), and 1.x imports itself by package
      // name ("@noble/hashes/crypto"), which the traced copies resolve to 2.x: otplib is bundled with its 2.x instead,
      // so only 1.x is traced
      inline: ['otplib', '@otplib', '@noble/hashes'],
      // Node 20.19+ loads a package's "module-sync" export (exceljs -> get-intrinsic -> async-function/require.mjs);
      // the file tracer assumes that only from Node 22, so tell it, or those files are missing from .output
      traceOptions: { conditions: ['node', 'module-sync'] },
    },
    ...(buildDir ? { output: { dir: `${buildDir}/.output` } } : {}),
  },
  hooks: {
    // domain errors become HTTP answers in one place (server/error-handler.ts), ahead of Nuxt's own handler
    'nitro:config'(config) {
      const after = [config.errorHandler ?? []].flat()
      config.errorHandler = [fileURLToPath(new URL('./server/error-handler.ts', import.meta.url)), ...after]
    },
    // the price-file rows worker (server/services/price-files/rows-worker.ts) and the part-search index worker run in
    // threads of their own, so they are bundled on their own, beside the server's entry, once the server is built
    // (dev builds too)
    'nitro:init'(nitro) {
      nitro.hooks.hook('compiled', async () => {
        const { build } = await import('esbuild')
        await build({
          entryPoints: [fileURLToPath(new URL('./server/services/price-files/rows-worker.ts', import.meta.url))],
          outfile: join(nitro.options.output.serverDir, 'price-rows-worker.cjs'),
          bundle: true, platform: 'node', format: 'cjs', target: 'node20', logLevel: 'warning',
          // XLSX files are read in the worker too: exceljs is loaded from the server's own node_modules beside it
          external: ['exceljs'],
        })
        // the part-search index is built in a thread of its own too (server/services/catalogue/index-worker.ts)
        await build({
          entryPoints: [fileURLToPath(new URL('./server/services/catalogue/index-worker.ts', import.meta.url))],
          outfile: join(nitro.options.output.serverDir, 'part-index-worker.cjs'),
          bundle: true, platform: 'node', format: 'cjs', target: 'node20', logLevel: 'warning',
          // the database drivers are loaded from the server's own node_modules beside it
          external: ['sqlite3', 'sequelize', 'pg', 'pg-hstore'],
        })
      })
    },
  },
  auth: { hash: { scrypt: { ...SCRYPT_OPTIONS } } },
  // The security module's headers and CSP (nonces on every script the server renders). Its request-size limiter
  // (trusts Content-Length, skips PATCH and chunked bodies), rate limiter (keyed on X-Forwarded-For, not atomic) and
  // XSS validator (buffers multipart bodies) are off: server/middleware/05.request-body.ts and the throttles in
  // server/services/throttle.ts do those jobs. Cross-site requests are refused by the session middleware.
  security: {
    nonce: true,
    sri: true,
    hidePoweredBy: true,
    removeLoggers: false,
    headers: {
      contentSecurityPolicy: {
        'default-src': ["'self'"],
        'base-uri': ["'none'"],
        'object-src': ["'none'"],
        'frame-ancestors': ["'none'"],
        'form-action': ["'self'"],
        'script-src': ["'self'", "'strict-dynamic'", "'nonce-{{nonce}}'"],
        'script-src-attr': ["'none'"],
        // Vue and Tailwind set style attributes; styles cannot run code
        'style-src': ["'self'", "'unsafe-inline'"],
        // QR codes and charts are drawn as data: and blob: images
        'img-src': ["'self'", 'data:', 'blob:'],
        'font-src': ["'self'"],
        'connect-src': ["'self'"],
        'frame-src': ["'self'"],
        'worker-src': ["'self'"],
        'upgrade-insecure-requests': false,
      },
      crossOriginEmbedderPolicy: false,
      xFrameOptions: 'DENY',
      referrerPolicy: 'no-referrer',
      strictTransportSecurity: { maxAge: 31536000, includeSubdomains: true },
    },
    requestSizeLimiter: false,
    rateLimiter: false,
    xssValidator: false,
    corsHandler: false,
    allowedMethodsRestricter: false,
    csrf: false,
  },
  typescript: { strict: true },
})
