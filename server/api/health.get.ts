// For load balancers, operators and tests: 200 when the database and the object store answer, else 503 with
// which dependency is down and why.
export default defineEventHandler(async (event) => {
  const status = serviceStatus()
  if (status.ready) {
    await useDb().selectFrom('users').select('id').limit(1).execute()
      .then(() => markService('database', 'up'), (error: Error) => markService('database', 'down', error.message))
    await useObjectStore().ensureBucket()
      .then(() => markService('storage', 'up'), (error: Error) => markService('storage', 'down', error.message))
  }
  const now = serviceStatus()
  const ok = now.ready && Object.values(now.services).every(state => state === 'up')
  setResponseHeader(event, 'cache-control', 'no-store')
  if (!ok) setResponseStatus(event, 503)
  return { ok, services: now.services, problems: now.problems }
})
