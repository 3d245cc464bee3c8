import type { Ref } from 'vue'
import { addSample, finishStroke, startStroke } from '#shared/sketch/strokes'
import type { StrokeDraft } from '#shared/sketch/strokes'
import type { SketchPoint } from '#shared/sketch/frame'
import type { SketchViewport } from './useSketchViewport'

interface Contact {
  x: number
  y: number
  type: string
}

// A finger that moves no further than this between down and up is a tap (common practice: about 8–10 px).
const TAP_SLOP_PX = 8

/**
 * Pointer input on the canvas: drawing with pen, mouse or finger, one-finger or mouse panning with the move
 * tool, two-finger pinch, wheel zoom. In pen-only mode fingers never draw: they move the view, and while the
 * pen is down they are ignored altogether, so a resting palm leaves no mark. With the pin tool a tap names a
 * place instead of drawing.
 */
export function useSketchInput(
  host: Ref<HTMLElement | null>,
  viewport: SketchViewport,
  onLive: (draft: StrokeDraft | null) => void,
  onPin: (at: SketchPoint) => void = () => undefined,
) {
  const store = useSketchStore()
  const contacts = new Map<number, Contact>()
  let drawing: { pointerId: number, draft: StrokeDraft } | null = null
  let panning: { pointerId: number, x: number, y: number, tap?: { x: number, y: number } | null } | null = null
  let pinch: { distance: number, x: number, y: number } | null = null
  let penSeen = false

  function local(event: PointerEvent | WheelEvent) {
    const rect = host.value!.getBoundingClientRect()
    return { x: event.clientX - rect.left, y: event.clientY - rect.top }
  }

  const touches = () => [...contacts.values()].filter(c => c.type === 'touch')

  function pinchState() {
    const [a, b] = touches()
    if (!a || !b) return null
    return { distance: Math.max(1, Math.hypot(a.x - b.x, a.y - b.y)), x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 }
  }

  function settings() {
    const tool = store.tool === 'move' || store.tool === 'pin' ? 'pencil' : store.tool
    const size = tool === 'fill' ? 0 : store.sizes[tool]
    return { tool, tone: store.tone, size }
  }

  function sample(draft: StrokeDraft, event: PointerEvent): boolean {
    const point = local(event)
    const at = viewport.toSketch(point.x, point.y)
    const pressure = event.pointerType === 'pen' ? event.pressure : 0.5
    return addSample(draft, at.x, at.y, pressure)
  }

  function commit() {
    if (!drawing) return
    const stroke = finishStroke(drawing.draft)
    if (stroke) store.addStroke(stroke)
  }

  function cancelDrawing() {
    drawing = null
    onLive(null)
  }

  function down(event: PointerEvent) {
    if (event.pointerType === 'mouse' && event.button !== 0 && event.button !== 1) return
    const pen = event.pointerType === 'pen'
    if (pen && !penSeen) {
      // The first pen contact switches palm rejection on; the observer can switch it off again.
      penSeen = true
      store.penOnly = true
    }
    const touch = event.pointerType === 'touch'
    if (touch && store.penOnly && drawing) return
    host.value?.setPointerCapture(event.pointerId)
    event.preventDefault()
    contacts.set(event.pointerId, { ...local(event), type: event.pointerType })
    if (touch && touches().length >= 2) {
      if (drawing && !pen) cancelDrawing()
      panning = null
      pinch = pinchState()
      return
    }
    const navigate = store.tool === 'move' || event.button === 1 || !store.editable || (touch && store.penOnly)
    if (navigate) {
      // With "Name a place", a finger that taps still pins (pen-only stops fingers drawing, not naming);
      // one that drags moves the view.
      const tapToPin = touch && store.tool === 'pin'
      panning = { pointerId: event.pointerId, ...local(event), tap: tapToPin ? local(event) : null }
      return
    }
    if (drawing) return
    if (store.tool === 'pin') {
      const at = local(event)
      onPin(viewport.toSketch(at.x, at.y))
      return
    }
    drawing = { pointerId: event.pointerId, draft: startStroke(settings(), pen) }
    sample(drawing.draft, event)
    onLive(drawing.draft)
  }

  function move(event: PointerEvent) {
    const contact = contacts.get(event.pointerId)
    if (!contact) return
    Object.assign(contact, local(event))
    if (pinch && contact.type === 'touch') {
      const next = pinchState()
      if (next) {
        viewport.panBy(next.x - pinch.x, next.y - pinch.y)
        viewport.zoomAt(next.x, next.y, next.distance / pinch.distance)
        pinch = next
      }
      return
    }
    if (panning?.pointerId === event.pointerId) {
      viewport.panBy(contact.x - panning.x, contact.y - panning.y)
      const tap = panning.tap && Math.hypot(contact.x - panning.tap.x, contact.y - panning.tap.y) <= TAP_SLOP_PX ? panning.tap : null
      panning = { pointerId: event.pointerId, x: contact.x, y: contact.y, tap }
      return
    }
    if (drawing?.pointerId !== event.pointerId) return
    // Coalesced samples carry the pen's full rate, which a frame-rate event stream drops.
    const samples = event.getCoalescedEvents?.() ?? [event]
    for (const each of samples.length ? samples : [event]) {
      if (!sample(drawing.draft, each)) {
        // A full stroke ends here and the line goes on as a new one.
        commit()
        drawing = { pointerId: event.pointerId, draft: startStroke(drawing.draft.settings, drawing.draft.pen) }
        sample(drawing.draft, each)
      }
    }
    onLive(drawing.draft)
  }

  function up(event: PointerEvent) {
    contacts.delete(event.pointerId)
    if (drawing?.pointerId === event.pointerId) {
      if (event.type === 'pointerup') commit()
      cancelDrawing()
    }
    if (panning?.pointerId === event.pointerId) {
      const tap = panning.tap
      panning = null
      if (tap && event.type === 'pointerup' && store.tool === 'pin') onPin(viewport.toSketch(tap.x, tap.y))
    }
    if (pinch && touches().length < 2) pinch = null
  }

  function wheel(event: WheelEvent) {
    event.preventDefault()
    const at = local(event)
    // Trackpad pinches arrive as wheel events with ctrlKey and small deltas; both zoom.
    viewport.zoomAt(at.x, at.y, Math.exp(-event.deltaY * (event.ctrlKey ? 0.01 : 0.0015)))
  }

  onMounted(() => {
    const el = host.value
    if (!el) return
    el.addEventListener('pointerdown', down)
    el.addEventListener('pointermove', move)
    el.addEventListener('pointerup', up)
    el.addEventListener('pointercancel', up)
    el.addEventListener('lostpointercapture', up)
    el.addEventListener('wheel', wheel, { passive: false })
  })
  onBeforeUnmount(() => {
    const el = host.value
    if (!el) return
    el.removeEventListener('pointerdown', down)
    el.removeEventListener('pointermove', move)
    el.removeEventListener('pointerup', up)
    el.removeEventListener('pointercancel', up)
    el.removeEventListener('lostpointercapture', up)
    el.removeEventListener('wheel', wheel)
  })
}
