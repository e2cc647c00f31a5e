// https://nuxt.com/docs/api/configuration/nuxt-config
export default defineNuxtConfig({
  compatibilityDate: '2025-07-15',
  srcDir: '.',
  modules: [
    '@nuxt/eslint',
    '@nuxtjs/tailwindcss',
    '@nuxtjs/i18n',
    '@pinia/nuxt',
    'nuxt-auth-utils',
  ],
  devtools: { enabled: false },
  experimental: {
    // A link fetches its page's code when it is touched or focused, not as soon as it is on
    // screen: on a phone that would download and run most of the app after the first page.
    defaults: { nuxtLink: { prefetchOn: { visibility: false, interaction: true } } },
  },
  telemetry: false,
  css: [
    '@fontsource/atkinson-hyperlegible/400.css',
    '@fontsource/atkinson-hyperlegible/700.css',
    '~/assets/css/main.css',
  ],
  app: {
    head: {
      titleTemplate: '%s · Tidewell',
      meta: [{ name: 'viewport', content: 'width=device-width, initial-scale=1' }],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  runtimeConfig: {
    // Every value here can be overridden by NUXT_* variables; see .env.example.
    databasePath: 'data/tidewell.sqlite',
    smtpUrl: '',
    mailFrom: 'Tidewell <no-reply@tidewell.test>',
    mailCatcherPort: 2525,
    // The local mail catcher outside development and the demo (NUXT_MAIL_CATCHER=true).
    mailCatcher: false,
    outboxPollMs: 2000,
    outboxRetryBaseMs: 30_000,
    // /api/ready answers 503 below this much free disk or with an e-mail unsent this long.
    readyMinFreeMb: 200,
    readyMaxOutboxAgeMin: 15,
    // The write line (server/utils/write-queue.ts): how many writes may wait, and how long.
    writeQueueMax: 200,
    writeQueueWaitMs: 10_000,
    // How many reverse proxies stand in front (0: none, X-Forwarded-For is ignored); see
    // clientIp() in server/utils/throttle.ts.
    trustProxy: 0,
    publicUrl: 'http://localhost:3000',
    seedDemo: false,
    seedDemoActivity: false,
    allowClockOverride: false,
    // Encrypts second-factor secrets at rest (server/utils/totp.ts); the session password when empty.
    totpKey: '',
    session: {
      name: 'tidewell-session',
      maxAge: 60 * 60 * 8,
      cookie: { sameSite: 'lax', httpOnly: true },
    },
  },
  hooks: {
    // nuxt-auth-utils adds an OAuth block for some forty providers to the runtime config;
    // Tidewell signs in with its own passwords only. Nitro copies the runtime config and
    // walks every key against the environment once per request (each internal fetch of a
    // server render is a request), which cost about 6 ms of CPU per Today page.
    'nitro:config'(config) {
      if (config.runtimeConfig) delete config.runtimeConfig.oauth
    },
  },
  nitro: {
    // Precompress everything in .output/public at build time (.gz and .br beside each file);
    // Nitro then serves the one the browser accepts. Page HTML and JSON are made per request
    // and gzip-compressed on the way out (server/plugins/07.compression.ts).
    compressPublicAssets: { gzip: true, brotli: true },
    experimental: { tasks: true },
    scheduledTasks: {
      '*/5 * * * *': ['outbox:send', 'triage:escalate'],
      '0 13 * * *': ['triage:overdue'],
      // Daily at 14:00 UTC, early morning in the demo clinic (America/Chicago).
      '0 14 * * *': ['schedule:reminders'],
      '0 15 * * *': ['diary:remind'],
    },
  },
  i18n: {
    restructureDir: '.',
    langDir: 'locales',
    defaultLocale: 'en',
    strategy: 'no_prefix',
    experimental: {
      // The messages' address holds a hash of the locale files (a new build with new words
      // gets a new address), so the browser may keep them for a day instead of 10 seconds:
      // 92 kB (uncompressed, Nitro does not compress routes) fetched once, not on every visit.
      httpCacheDuration: 60 * 60 * 24,
    },
    locales: [
      { code: 'en', language: 'en-US', name: 'English', file: 'en.json' },
      { code: 'es', language: 'es-US', name: 'Español', file: 'es.json' },
    ],
    detectBrowserLanguage: {
      useCookie: true,
      cookieKey: 'tidewell_lang',
      redirectOn: 'root',
      alwaysRedirect: false,
    },
  },
  tailwindcss: {
    cssPath: false,
  },
  eslint: {
    config: { stylistic: false },
  },
  typescript: {
    strict: true,
  },
})
