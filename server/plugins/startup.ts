// Opens and migrates the database, seeds the demo when asked, and starts the
// embedded S3 and mail catcher when no real ones are configured.
export default defineNitroPlugin((nitro) => {
  startServices().catch((error) => {
    console.error('[shadowline] start-up failed:', error)
    process.exitCode = 1
  })
  nitro.hooks.hook('close', () => stopServices())
})
