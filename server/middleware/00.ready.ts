// Holds requests until start-up (migrations, storage, mail) has finished.
export default defineEventHandler(async () => {
  await whenReady()
})
