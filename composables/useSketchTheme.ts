import type { SketchPalette } from '#shared/sketch/paint'

type Rgb = readonly [number, number, number]

/** The canvas's colours, read from the theme tokens so the canvas follows night mode like the page. */
export interface SketchTheme {
  palette: SketchPalette
  sky: string
  shade: string
  lit: string
  line: string
  muted: string
  terminator: string
}

function token(style: CSSStyleDeclaration, name: string): Rgb {
  const [r = 0, g = 0, b = 0] = style.getPropertyValue(`--c-${name}`).trim().split(/\s+/).map(Number)
  return [r, g, b]
}

const css = ([r, g, b]: Rgb, alpha = 1) => `rgb(${r} ${g} ${b} / ${alpha})`

function readTheme(): SketchTheme {
  const style = getComputedStyle(document.documentElement)
  const ink = token(style, 'ink')
  const lit = token(style, 'lit')
  return {
    palette: { dark: ink, lit },
    sky: css(ink),
    shade: css(token(style, 'shade')),
    // The guide's lit part stays well below a lit stroke, so light strokes show over it.
    lit: css(lit, 0.38),
    line: css(token(style, 'line')),
    muted: css(token(style, 'muted')),
    terminator: css(token(style, 'caution')),
  }
}

/** Re-reads the tokens whenever the theme class on <html> changes (the night toggle, or another tab's choice). */
export function useSketchTheme() {
  const theme = shallowRef<SketchTheme>(readTheme())
  let observer: MutationObserver | undefined
  onMounted(() => {
    theme.value = readTheme()
    observer = new MutationObserver(() => {
      theme.value = readTheme()
    })
    observer.observe(document.documentElement, { attributes: true, attributeFilter: ['class'] })
  })
  onBeforeUnmount(() => observer?.disconnect())
  return theme
}
