import { DISK_CENTRE, SKETCH_SIZE } from '#shared/sketch/frame'

const MIN_ZOOM = 0.5
const MAX_ZOOM = 8

/**
 * Zoom and pan of the canvas. Zoom 1 fits the whole sketch frame in the view; the pan is in screen pixels
 * from that centred place. Screen points are relative to the canvas element.
 */
export function useSketchViewport() {
  const width = ref(0)
  const height = ref(0)
  const zoom = ref(1)
  const panX = ref(0)
  const panY = ref(0)

  const fit = computed(() => Math.max(0.01, Math.min(width.value, height.value) / SKETCH_SIZE * 0.96))
  const scale = computed(() => fit.value * zoom.value)
  const offset = computed(() => ({
    x: width.value / 2 + panX.value - DISK_CENTRE * scale.value,
    y: height.value / 2 + panY.value - DISK_CENTRE * scale.value,
  }))

  function toSketch(x: number, y: number) {
    return { x: (x - offset.value.x) / scale.value, y: (y - offset.value.y) / scale.value }
  }

  /** Keeps some of the frame on screen however far it is dragged. */
  function clampPan() {
    const reach = (SKETCH_SIZE / 2) * scale.value
    panX.value = Math.max(-reach, Math.min(reach, panX.value))
    panY.value = Math.max(-reach, Math.min(reach, panY.value))
  }

  /** Zooms by `factor` keeping the sketch point under (x, y) where it is. */
  function zoomAt(x: number, y: number, factor: number) {
    const anchor = toSketch(x, y)
    zoom.value = Math.max(MIN_ZOOM, Math.min(MAX_ZOOM, zoom.value * factor))
    panX.value = x - anchor.x * scale.value - width.value / 2 + DISK_CENTRE * scale.value
    panY.value = y - anchor.y * scale.value - height.value / 2 + DISK_CENTRE * scale.value
    clampPan()
  }

  function zoomBy(factor: number) {
    zoomAt(width.value / 2, height.value / 2, factor)
  }

  function panBy(dx: number, dy: number) {
    panX.value += dx
    panY.value += dy
    clampPan()
  }

  function reset() {
    zoom.value = 1
    panX.value = 0
    panY.value = 0
  }

  function resize(w: number, h: number) {
    width.value = w
    height.value = h
    clampPan()
  }

  const stageConfig = computed(() => ({
    width: width.value,
    height: height.value,
    scaleX: scale.value,
    scaleY: scale.value,
    x: offset.value.x,
    y: offset.value.y,
  }))

  return { width, height, zoom, scale, stageConfig, toSketch, zoomAt, zoomBy, panBy, reset, resize }
}

export type SketchViewport = ReturnType<typeof useSketchViewport>
