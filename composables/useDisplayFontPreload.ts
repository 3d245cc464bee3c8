import displayFont from '~/assets/fonts/crimson-pro-400-core.woff2?url'

declare module '#app' {
  interface PageMeta {
    /**
     * False where no display-font text shows on the first screen (the sketch desk, whose tools and canvas
     * fill it): there the font is not preloaded, so it does not compete with what the page needs first.
     */
    displayFontAboveFold?: boolean
  }
}

/**
 * Preloads the display font (headings, the brand) on pages that show it on the first screen, so it arrives
 * with the stylesheet instead of after it and the headings do not reflow when it swaps in. The file is the
 * same hashed asset the stylesheet's @font-face names, so the browser fetches it once.
 */
export function useDisplayFontPreload() {
  const route = useRoute()
  useHead({
    link: computed(() => route.meta.displayFontAboveFold === false
      ? []
      : [{ key: 'display-font', rel: 'preload', as: 'font', type: 'font/woff2', href: displayFont, crossorigin: 'anonymous' }]),
  })
}
