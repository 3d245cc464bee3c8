// Opens and migrates the database, seeds the demo when asked, and starts the embedded S3 and mail catcher
// when no real ones are configured. Each step is retried until it works (server/utils/startup.ts), so a
// dependency that is down at start delays the site rather than killing it.
export default defineNitroPlugin((nitro) => {
  startServices().catch((error) => {
    console.error('[shadowline] start-up stopped:', error)
  })
  nitro.hooks.hook('close', () => stopServices())
})
