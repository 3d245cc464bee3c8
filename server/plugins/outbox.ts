// Delivers queued mail on a timer, so messages queued while the mail server was
// down go out once it is back; and removes stored objects whose removal had to wait.
export default defineNitroPlugin((nitro) => {
  const every = Math.max(1000, Number(useRuntimeConfig().outboxIntervalMs) || 5000)
  const timer = setInterval(() => {
    whenReady().then(() => drainOutbox(useDb())).catch(() => undefined)
    // Stored objects whose removal failed when their rows were deleted.
    whenReady().then(() => removeQueuedObjects(useDb())).catch(() => undefined)
  }, every)
  timer.unref()
  nitro.hooks.hook('close', () => clearInterval(timer))
})
