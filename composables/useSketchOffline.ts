/**
 * Registers the sketch pages' service worker (server/api/sketches/offline-worker.get.ts) and hands it the
 * page and the assets it has loaded, so this page opens again with no network. The worker's address carries
 * the build, so a new deployment installs a new worker with a new cache. In development there is no worker
 * at all (its assets change on every edit and carry no content hash), and one left from an earlier visit is
 * removed.
 */
export function useSketchOffline() {
  const buildId = useRuntimeConfig().app.buildId
  onMounted(async () => {
    if (!('serviceWorker' in navigator)) return
    try {
      if (import.meta.dev) {
        const registrations = await navigator.serviceWorker.getRegistrations()
        await Promise.all(registrations.map(r => r.unregister()))
        return
      }
      await navigator.serviceWorker.register(`/api/sketches/offline-worker?build=${encodeURIComponent(buildId)}`, { scope: '/sketches/' })
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
