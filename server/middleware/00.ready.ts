// Holds requests until start-up (migrations, storage, mail) has finished; past a short wait the answer is
// 503 naming what is not there yet, so a client is not left hanging while a dependency is down.
// /api/health answers at once.
const WAIT_MS = 10_000

export default defineEventHandler(async (event) => {
  if (event.path.startsWith('/api/health')) return
  if (serviceStatus().ready) return
  const done = await Promise.race([
    whenReady().then(() => true, () => false),
    new Promise<boolean>(resolve => setTimeout(resolve, WAIT_MS, false)),
  ])
  if (done) return
  const down = Object.entries(serviceStatus().services).filter(([, state]) => state !== 'up').map(([name]) => name)
  setResponseHeader(event, 'retry-after', 10)
  throw createError({ status: 503, message: `Shadowline is starting up and waiting for: ${down.join(', ')}. Try again in a moment.` })
})
