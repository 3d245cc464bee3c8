import VueKonva from 'vue-konva'

// Konva needs a DOM canvas, so its Vue components exist on the client only; the editor renders them inside
// <ClientOnly>.
export default defineNuxtPlugin((nuxtApp) => {
  nuxtApp.vueApp.use(VueKonva)
})
