// Shadowline — Nuxt configuration. Source lives at the repository root (srcDir '.').
export default defineNuxtConfig({
  modules: ['@pinia/nuxt', '@nuxtjs/tailwindcss', 'nuxt-auth-utils', '@nuxt/eslint'],
  devtools: { enabled: false },
  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      title: 'Shadowline',
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1, viewport-fit=cover' },
        { name: 'theme-color', content: '#0d1117' },
        { name: 'description', content: 'A shared lunar sketch atlas for observers, clubs and classes.' },
      ],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  css: ['~/assets/css/main.css'],
  runtimeConfig: {
    // Every key can be set by its NUXT_* environment variable (see README).
    dataDir: '.data',
    databaseUrl: '',
    seedDemo: '',
    // Published atlas pages kept ready to send (0 turns the cache off).
    atlasCacheEntries: 500,
    session: {
      password: '',
      name: 'shadowline-session',
      cookie: { sameSite: 'lax' },
      maxAge: 60 * 60 * 24 * 14,
    },
    s3: {
      endpoint: '',
      region: 'us-east-1',
      bucket: 'shadowline',
      accessKeyId: '',
      secretAccessKey: '',
      forcePathStyle: 'true',
      embeddedPort: '4569',
    },
    smtp: {
      host: '',
      port: '587',
      secure: '',
      user: '',
      pass: '',
      from: 'Shadowline <no-reply@shadowline.test>',
      embeddedPort: '2525',
    },
    outboxIntervalMs: '5000',
    trustedProxies: '',
    public: {
      siteUrl: '',
    },
  },
  dir: {
    public: 'public',
  },
  srcDir: '.',
  serverDir: 'server',
  experimental: {
    // Links fetch the code of the page they lead to when touched or focused, not as soon as they scroll
    // into view: on a phone on a slow or metered connection, a page downloads what it shows.
    defaults: { nuxtLink: { prefetchOn: { visibility: false, interaction: true } } },
  },
  compatibilityDate: '2026-11-01',
  nitro: {
    experimental: { tasks: false },
    // Brotli and gzip copies of the built JS, CSS and other text assets, written at build time and served by
    // the built server to every browser that accepts them (hashed /_nuxt/ files keep their year-long
    // immutable caching). WOFF2 fonts are compressed inside already and are served as they are.
    compressPublicAssets: { gzip: true, brotli: true },
    externals: {
      // Native and CommonJS-heavy packages are loaded from the project's node_modules
      // at run time rather than bundled or copied: the server runs from the checkout.
      external: ['better-sqlite3', 'sharp', '@napi-rs/canvas', 's3rver', 'smtp-server', 'mailparser', '@aws-sdk/client-s3', 'nodemailer'],
      trace: false,
    },
  },
  typescript: {
    strict: true,
  },
  telemetry: false,
  eslint: {
    config: { stylistic: true },
  },
  tailwindcss: {
    cssPath: false,
    viewer: false,
  },
})
