import type { EditorTool } from '~/stores/sketch'
import type { SketchViewport } from './useSketchViewport'

const TOOL_KEYS: Record<string, EditorTool> = { p: 'pencil', s: 'shade', e: 'eraser', f: 'fill', m: 'move', l: 'pin' }

/** Keyboard use of the editor: undo/redo, tools, zoom, pan, save. Ignored while typing in a field. */
export function useSketchKeyboard(viewport: SketchViewport, save: () => void) {
  const store = useSketchStore()

  function typing(target: EventTarget | null): boolean {
    if (!(target instanceof HTMLElement)) return false
    if (target.isContentEditable) return true
    if (target instanceof HTMLInputElement) return !['button', 'checkbox', 'radio'].includes(target.type)
    return target instanceof HTMLTextAreaElement || target instanceof HTMLSelectElement
  }

  function onKey(event: KeyboardEvent) {
    if (typing(event.target)) return
    const key = event.key.toLowerCase()
    const command = event.ctrlKey || event.metaKey
    if (command && key === 'z') {
      event.preventDefault()
      if (event.shiftKey) store.redo()
      else store.undo()
      return
    }
    if (command && key === 'y') {
      event.preventDefault()
      store.redo()
      return
    }
    if (command && key === 's') {
      event.preventDefault()
      save()
      return
    }
    if (command || event.altKey) return
    const tool = TOOL_KEYS[key]
    const pan = 60
    if (tool) store.tool = tool
    else if (key === '+' || key === '=') viewport.zoomBy(1.25)
    else if (key === '-') viewport.zoomBy(0.8)
    else if (key === '0') viewport.reset()
    else if (key === 'arrowleft') viewport.panBy(pan, 0)
    else if (key === 'arrowright') viewport.panBy(-pan, 0)
    else if (key === 'arrowup') viewport.panBy(0, pan)
    else if (key === 'arrowdown') viewport.panBy(0, -pan)
    else return
    event.preventDefault()
  }

  onMounted(() => window.addEventListener('keydown', onKey))
  onBeforeUnmount(() => window.removeEventListener('keydown', onKey))
}
