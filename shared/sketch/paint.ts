// The painter draws through the Canvas 2D interface, which the server has too (@napi-rs/canvas); its types
// are the DOM's, so they are named here for the server's type check as well.
/// <reference lib="dom" />
// Paints strokes on a 2D canvas context: the editor's drawing layer, the raster the server draws (through a
// Canvas 2D for Node) and the benchmark's bare-canvas baseline all call this, so they draw the same thing.

import { SHADE_ALPHA, SHADE_BLUR, strokeOutline } from './outline'
import type { Stroke } from './schema'

/** The colours a tone maps to: from `dark` (tone 0) to `lit` (tone 1), as r, g, b 0..255. */
export interface SketchPalette {
  dark: readonly [number, number, number]
  lit: readonly [number, number, number]
}

/** The stored raster is neutral grey on black whatever the screen theme; night mode is a display matter. */
export const RASTER_PALETTE: SketchPalette = { dark: [0, 0, 0], lit: [255, 255, 255] }

export function toneColour(palette: SketchPalette, tone: number): string {
  const mix = (i: 0 | 1 | 2) => Math.round(palette.dark[i] + (palette.lit[i] - palette.dark[i]) * tone)
  return `rgb(${mix(0)} ${mix(1)} ${mix(2)})`
}

/**
 * Smooth outline through the midpoints of the polygon's edges (quadratic curves with the vertices as control
 * points), the construction perfect-freehand's documentation recommends for filling its output.
 */
export function outlinePath(outline: readonly number[], closed: boolean): Path2D {
  const path = new Path2D()
  const n = outline.length / 2
  if (n < 2) return path
  if (n < 4 || !closed) {
    path.moveTo(outline[0]!, outline[1]!)
    for (let i = 1; i < n; i++) path.lineTo(outline[2 * i]!, outline[2 * i + 1]!)
    path.closePath()
    return path
  }
  const mid = (i: number, axis: 0 | 1) => (outline[(2 * (i % n)) + axis]! + outline[(2 * ((i + 1) % n)) + axis]!) / 2
  path.moveTo(mid(0, 0), mid(0, 1))
  for (let i = 1; i <= n; i++) {
    const k = i % n
    path.quadraticCurveTo(outline[2 * k]!, outline[2 * k + 1]!, mid(i, 0), mid(i, 1))
  }
  path.closePath()
  return path
}

const paths = new WeakMap<Stroke, Path2D>()

/** Strokes are never changed once made (edits replace them), so each one's path is built once. */
export function strokePath(stroke: Stroke): Path2D {
  let path = paths.get(stroke)
  if (!path) {
    path = outlinePath(strokeOutline(stroke), true)
    paths.set(stroke, path)
  }
  return path
}

const reaches = new WeakMap<Stroke, [number, number, number, number]>()

/**
 * The box a blurred shade stroke can reach: its points, half its width, and three times the blur's radius
 * (a Gaussian's standard deviation; beyond 3σ less than 0.3 % of it is left).
 */
function shadeReach(stroke: Stroke & { size: number }): [number, number, number, number] {
  let box = reaches.get(stroke)
  if (!box) {
    let [x0, y0, x1, y1] = [Infinity, Infinity, -Infinity, -Infinity]
    for (let i = 0; i + 1 < stroke.points.length; i += 3) {
      x0 = Math.min(x0, stroke.points[i]!)
      x1 = Math.max(x1, stroke.points[i]!)
      y0 = Math.min(y0, stroke.points[i + 1]!)
      y1 = Math.max(y1, stroke.points[i + 1]!)
    }
    const pad = stroke.size / 2 + 3 * stroke.size * SHADE_BLUR
    box = [x0 - pad, y0 - pad, x1 - x0 + 2 * pad, y1 - y0 + 2 * pad]
    reaches.set(stroke, box)
  }
  return box
}

/** The part of a 2D context the painter uses; a canvas element's and an offscreen canvas's both fit. */
export type PaintContext = Pick<
  CanvasRenderingContext2D,
  'save' | 'restore' | 'fill' | 'fillStyle' | 'globalAlpha' | 'globalCompositeOperation' | 'filter' | 'getTransform'
  | 'beginPath' | 'rect' | 'clip'
>

/** What the raster painter needs besides: the paper is filled in behind the strokes. */
export type RasterContext = PaintContext & Pick<CanvasRenderingContext2D, 'fillRect' | 'setTransform'>

/** Canvas filters are missing in older Safari; shading then falls back to a plain translucent pass. */
function canBlur(ctx: PaintContext): boolean {
  return typeof ctx.filter === 'string'
}

export function paintStroke(ctx: PaintContext, stroke: Stroke, palette: SketchPalette, path: Path2D = strokePath(stroke)): void {
  ctx.save()
  switch (stroke.tool) {
    case 'eraser':
      ctx.globalCompositeOperation = 'destination-out'
      ctx.fillStyle = '#000'
      break
    case 'shade': {
      ctx.fillStyle = toneColour(palette, stroke.tone)
      ctx.globalAlpha = SHADE_ALPHA
      if (canBlur(ctx)) {
        // A blur filter works over the whole clip region; limited to what the stroke can reach, it costs what
        // the stroke costs rather than what the canvas does (over ten times less on a 2048² canvas).
        ctx.beginPath()
        ctx.rect(...shadeReach(stroke))
        ctx.clip()
        // A filter's radius is in canvas pixels, outside the transform: scale it with the current zoom.
        const m = ctx.getTransform()
        ctx.filter = `blur(${(stroke.size * SHADE_BLUR * Math.hypot(m.a, m.b)).toFixed(2)}px)`
      }
      break
    }
    default:
      ctx.fillStyle = toneColour(palette, stroke.tone)
  }
  ctx.fill(path, 'nonzero')
  ctx.restore()
}

export function paintStrokes(ctx: PaintContext, strokes: readonly Stroke[], palette: SketchPalette): void {
  for (const stroke of strokes) paintStroke(ctx, stroke, palette)
}

/**
 * The stored image of a drawing on a square of `edge` pixels (SKETCH_SIZE for one pixel per unit): grey on
 * black, never the guide. The paper goes in behind the strokes last, so the eraser's cut-outs show it too.
 */
export function paintRaster(ctx: RasterContext, strokes: readonly Stroke[], edge: number, size: number): void {
  const scale = edge / size
  ctx.setTransform(scale, 0, 0, scale, 0, 0)
  paintStrokes(ctx, strokes, RASTER_PALETTE)
  ctx.setTransform(1, 0, 0, 1, 0, 0)
  ctx.save()
  ctx.globalCompositeOperation = 'destination-over'
  ctx.fillStyle = '#000'
  ctx.fillRect(0, 0, edge, edge)
  ctx.restore()
}
