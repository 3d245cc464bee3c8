// The sketch pages' service worker. With it, a sketch page reloaded with no network still opens, and the
// editor then takes the drawing from this device's IndexedDB copy (composables/useSketchSync.ts). Its
// scope is /sketches/ only: pages load from the network whenever they can; the cache is the fallback, and
// API requests are never touched.
//
// Served from here rather than as a static file so it stays with the sketch code; the header below lets a
// script under /api/sketches/ control /sketches/. Its cache is named after the build, and a new build's
// worker drops every older cache when it takes over, so no page is ever served code of another build. In
// development the app registers no worker, and this route answers with one that removes itself (and its
// caches) from a browser that still holds a worker from before.
const CACHE_PREFIX = 'shadowline-sketch-pages-'

const worker = (buildId: string) => `
const CACHE = ${JSON.stringify(CACHE_PREFIX + buildId)}

self.addEventListener('install', () => self.skipWaiting())
self.addEventListener('activate', (event) => event.waitUntil(
  caches.keys()
    .then((keys) => Promise.all(keys.filter((key) => key.startsWith(${JSON.stringify(CACHE_PREFIX)}) && key !== CACHE).map((key) => caches.delete(key))))
    .then(() => self.clients.claim()),
))

// The page lists what it loaded before this worker was in control, so the next offline visit has it all.
self.addEventListener('message', (event) => {
  if (event.data && event.data.type === 'keep' && Array.isArray(event.data.urls)) {
    event.waitUntil(caches.open(CACHE).then((cache) => Promise.all(event.data.urls.map((url) => cache.add(url).catch(() => undefined)))))
  }
})

function remember(request, response) {
  if (response.ok) {
    const copy = response.clone()
    caches.open(CACHE).then((cache) => cache.put(request, copy))
  }
  return response
}

self.addEventListener('fetch', (event) => {
  const request = event.request
  if (request.method !== 'GET') return
  const url = new URL(request.url)
  if (url.origin !== self.location.origin) return
  if (request.mode === 'navigate' && url.pathname.startsWith('/sketches/')) {
    const key = url.origin + url.pathname
    event.respondWith(fetch(request).then((response) => remember(key, response))
      .catch(() => caches.match(key).then((hit) => hit || Response.error())))
    return
  }
  // Built assets carry their content hash in the name: a cached copy is always right. The deployment
  // pointer (builds/latest.json) is not, so it goes to the network as usual.
  if (url.pathname.startsWith('/_nuxt/') && !url.pathname.endsWith('/latest.json')) {
    event.respondWith(caches.match(request).then((hit) => hit || fetch(request).then((response) => remember(request, response))))
  }
})
`

const REMOVE_ITSELF = `
self.addEventListener('install', () => self.skipWaiting())
self.addEventListener('activate', (event) => event.waitUntil(
  caches.keys()
    .then((keys) => Promise.all(keys.filter((key) => key.startsWith(${JSON.stringify(CACHE_PREFIX)})).map((key) => caches.delete(key))))
    .then(() => self.registration.unregister())
    .then(() => self.clients.matchAll({ type: 'window' }))
    .then((clients) => clients.forEach((client) => client.navigate(client.url))),
))
`

export default defineEventHandler((event) => {
  setResponseHeaders(event, {
    'content-type': 'text/javascript; charset=utf-8',
    'cache-control': 'no-cache',
    'service-worker-allowed': '/sketches/',
  })
  return import.meta.dev ? REMOVE_ITSELF : worker(useRuntimeConfig(event).app.buildId)
})
