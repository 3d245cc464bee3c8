/** The theme's colours as CSS colour strings, re-read when night mode changes (for canvas charts). */
export function useThemeColours() {
  const display = useDisplayStore()
  const read = () => {
    if (!import.meta.client) return { text: '#ccc', muted: '#888', accent: '#8ab4d6', caution: '#e8be6e', line: '#343f50', lit: '#ece6d4' }
    const style = getComputedStyle(document.documentElement)
    const colour = (name: string) => `rgb(${style.getPropertyValue(`--c-${name}`).trim().split(/\s+/).join(', ')})`
    return { text: colour('text'), muted: colour('muted'), accent: colour('accent'), caution: colour('caution'), line: colour('line'), lit: colour('lit') }
  }
  const colours = ref(read())
  watch(() => display.night, () => nextTick(() => {
    colours.value = read()
  }))
  onMounted(() => {
    colours.value = read()
  })
  return colours
}
