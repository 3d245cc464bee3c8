// Campaign reminders and the leaders' comment digests, queued into the outbox on the outbox's timer.
export default defineNitroPlugin((nitro) => {
  const every = Math.max(1000, Number(useRuntimeConfig().outboxIntervalMs) || 5000)
  const base = () => (useRuntimeConfig().public.siteUrl || `http://localhost:${process.env.PORT || 3000}`).replace(/\/$/, '')
  const timer = setInterval(() => {
    whenReady().then(async () => {
      const queued = await queueCampaignMail(useDb(), base())
      if (queued.reminders || queued.digests) await drainOutbox(useDb())
    }).catch(error => console.error('[campaign mail]', error))
  }, every)
  timer.unref()
  nitro.hooks.hook('close', () => clearInterval(timer))
})
