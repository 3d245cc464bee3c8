// State-changing requests come from the app's own pages only. A page elsewhere can make a browser post a
// form here (with the visitor's cookies), so such requests must not be from another site (Sec-Fetch-Site,
// Origin) and must carry JSON or the multipart uploads the save routes read, never a plain form encoding.
const CHANGES = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])
const BODY_TYPES = /^(application\/json|multipart\/form-data)\s*(;|$)/i

export default defineEventHandler((event) => {
  if (!CHANGES.has(event.method) || !event.path.startsWith('/api/')) return
  const fetchSite = getRequestHeader(event, 'sec-fetch-site')
  if (fetchSite && fetchSite !== 'same-origin' && fetchSite !== 'none') {
    throw createError({ status: 403, message: 'Requests from other sites are refused.' })
  }
  const origin = getRequestHeader(event, 'origin')
  if (origin && origin !== 'null' && !sameSite(event, origin)) {
    throw createError({ status: 403, message: 'Requests from other sites are refused.' })
  }
  if (origin === 'null') throw createError({ status: 403, message: 'Requests from other sites are refused.' })
  const length = Number(getRequestHeader(event, 'content-length') ?? 0)
  const hasBody = length > 0 || getRequestHeader(event, 'transfer-encoding') != null
  if (hasBody && !BODY_TYPES.test(getRequestHeader(event, 'content-type') ?? '')) {
    throw createError({ status: 415, message: 'Send the request as JSON (application/json).' })
  }
})

function sameSite(event: Parameters<typeof getRequestHeader>[0], origin: string): boolean {
  let host: string
  try {
    host = new URL(origin).host
  }
  catch {
    return false
  }
  const configured = String(useRuntimeConfig(event).public.siteUrl ?? '')
  return host === getRequestHost(event) || (configured !== '' && new URL(configured).host === host)
}
