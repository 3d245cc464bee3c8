/**
 * Registers the sketch pages' service worker (server/api/sketches/offline-worker.get.ts) and hands it the
 * page and the assets it has loaded, so this page opens again with no network.
 */
export function useSketchOffline() {
  onMounted(async () => {
    if (!('serviceWorker' in navigator)) return
    try {
      await navigator.serviceWorker.register('/api/sketches/offline-worker', { scope: '/sketches/' })
      const ready = await navigator.serviceWorker.ready
      const assets = performance.getEntriesByType('resource')
        .map(entry => new URL(entry.name))
        .filter(url => url.origin === location.origin && url.pathname.startsWith('/_nuxt/') && !url.pathname.endsWith('/latest.json'))
        .map(url => url.pathname + url.search)
      ready.active?.postMessage({ type: 'keep', urls: [location.pathname, ...new Set(assets)] })
    }
    catch {
      // Without a worker the editor still keeps every stroke on the device; only an offline reload needs it.
    }
  })
}
