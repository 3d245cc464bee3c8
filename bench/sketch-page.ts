// Loaded into the benchmark's chromium page as a plain script: the same painter and raster code the editor
// uses, callable on a bare canvas without Konva or Vue.

import { paintStrokes } from '../shared/sketch/paint'
import type { Stroke } from '../shared/sketch/schema'
import { renderSketchRaster } from '../composables/useSketchRaster'

declare global {
  interface Window {
    sketchBench: typeof api
  }
}

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
    paintStrokes(ctx, strokes, { dark: [13, 17, 23], lit: [236, 230, 212] })
    const ms = performance.now() - start
    canvas.remove()
    return ms
  },
  /** The editor's upload raster for these strokes, as base64 PNG. */
  async raster(strokes: Stroke[]): Promise<string> {
    const blob = await renderSketchRaster(strokes)
    const bytes = new Uint8Array(await blob.arrayBuffer())
    let text = ''
    for (let i = 0; i < bytes.length; i += 0x8000) text += String.fromCharCode(...bytes.subarray(i, i + 0x8000))
    return btoa(text)
  },
}

window.sketchBench = api
