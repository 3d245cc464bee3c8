// Paints strokes on a 2D canvas context: the editor's drawing layer, the raster the client uploads and the
// benchmark's bare-canvas baseline all call this, so they draw exactly the same thing.

import { SHADE_ALPHA, SHADE_BLUR, strokeOutline } from './outline'
import type { Stroke } from './schema'

/** The colours a tone maps to: from `dark` (tone 0) to `lit` (tone 1), as r, g, b 0..255. */
export interface SketchPalette {
  dark: readonly [number, number, number]
  lit: readonly [number, number, number]
}

/** The uploaded raster is neutral grey on black whatever the screen theme; night mode is a display matter. */
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

/** The part of a 2D context the painter uses; a canvas element's and an offscreen canvas's both fit. */
export type PaintContext = Pick<
  CanvasRenderingContext2D,
  'save' | 'restore' | 'fill' | 'fillStyle' | 'globalAlpha' | 'globalCompositeOperation' | 'filter' | 'getTransform'
>

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
