// Loaded into a chromium page as a plain script (tests/support/painter.ts builds it): the editor's painter
// and stroke code, callable on bare canvases without Konva or Vue. The benchmark paints with it; the raster
// test compares the server's image with the browser's painting of the same strokes.

import { SKETCH_SIZE } from '../../shared/sketch/frame'
import { strokeOutline } from '../../shared/sketch/outline'
import { outlinePath, paintRaster, paintStroke, paintStrokes } from '../../shared/sketch/paint'
import type { RasterContext, SketchPalette } from '../../shared/sketch/paint'
import type { Stroke } from '../../shared/sketch/schema'
import { addSample, draftAsStroke, startStroke } from '../../shared/sketch/strokes'
import type { StrokeDraft } from '../../shared/sketch/strokes'

declare global {
  interface Window {
    sketchPainter: typeof api
  }
}

const SCREEN: SketchPalette = { dark: [13, 17, 23], lit: [236, 230, 212] }

const api = {
  /** Paints the strokes on a new canvas with the given transform; answers the milliseconds it took. */
  paintBare(strokes: Stroke[], width: number, height: number, transform: [number, number, number, number, number, number]): number {
    const canvas = document.createElement('canvas')
    canvas.width = width
    canvas.height = height
    document.body.appendChild(canvas)
    const ctx = canvas.getContext('2d')!
    const start = performance.now()
    ctx.setTransform(...transform)
    paintStrokes(ctx, strokes, SCREEN)
    const ms = performance.now() - start
    canvas.remove()
    return ms
  },

  /** The stored image of these strokes as the browser paints it: `edge`² RGBA pixels, base64. */
  rasterPixels(strokes: Stroke[], edge: number): string {
    const canvas = document.createElement('canvas')
    canvas.width = edge
    canvas.height = edge
    const ctx = canvas.getContext('2d')!
    paintRaster(ctx as RasterContext, strokes, edge, SKETCH_SIZE)
    const bytes = new Uint8Array(ctx.getImageData(0, 0, edge, edge).data.buffer)
    let text = ''
    for (let i = 0; i < bytes.length; i += 0x8000) text += String.fromCharCode(...bytes.subarray(i, i + 0x8000))
    return btoa(text)
  },

  /**
   * The least an editor must do for a pen: committed strokes painted once on a full-window canvas, and each
   * pointer move adding a sample and repainting the stroke in progress on a canvas above, by the editor's
   * own painter. The benchmark's baseline for pen-to-ink latency.
   */
  bareEditor(strokes: Stroke[], transform: [number, number, number, number, number, number]): void {
    const make = () => {
      const canvas = document.createElement('canvas')
      canvas.width = innerWidth * devicePixelRatio
      canvas.height = innerHeight * devicePixelRatio
      Object.assign(canvas.style, { position: 'fixed', inset: '0', width: '100vw', height: '100vh', touchAction: 'none' })
      document.body.appendChild(canvas)
      return canvas.getContext('2d')!
    }
    const below = make()
    const live = make()
    below.setTransform(...transform)
    paintStrokes(below, strokes, SCREEN)
    const [a, , , d, e, f] = transform
    let draft: StrokeDraft | null = null
    const toSketch = (event: PointerEvent) => ({ x: (event.clientX * devicePixelRatio - e) / a, y: (event.clientY * devicePixelRatio - f) / d })
    const draw = () => {
      live.setTransform(1, 0, 0, 1, 0, 0)
      live.clearRect(0, 0, live.canvas.width, live.canvas.height)
      const stroke = draft && draftAsStroke(draft)
      if (!stroke) return
      live.setTransform(...transform)
      paintStroke(live, stroke, SCREEN, outlinePath(strokeOutline(stroke, false), true))
    }
    live.canvas.addEventListener('pointerdown', (event) => {
      draft = startStroke({ tool: 'pencil', tone: 1, size: 8 }, false)
      const at = toSketch(event)
      addSample(draft, at.x, at.y, 0.5)
      draw()
    })
    live.canvas.addEventListener('pointermove', (event) => {
      if (!draft) return
      const at = toSketch(event)
      addSample(draft, at.x, at.y, 0.5)
      draw()
    })
    live.canvas.addEventListener('pointerup', () => {
      const stroke = draft && draftAsStroke(draft)
      if (stroke) paintStroke(below, stroke, SCREEN)
      draft = null
      draw()
    })
  },
}

window.sketchPainter = api
