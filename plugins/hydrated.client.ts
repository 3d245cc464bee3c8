// Marks the page once the client has taken over the server-rendered HTML, so automated browser checks
// (and anything else that must not act on inert HTML) know when typing and clicking are handled.
export default defineNuxtPlugin((nuxtApp) => {
  nuxtApp.hook('app:suspense:resolve', () => {
    document.documentElement.dataset.hydrated = 'true'
  })
})
