// From stored points to the outline that is filled on screen and in the raster. perfect-freehand turns a
// pressure-varying centre line into a polygon; the options per tool are part of what schema version 1 means,
// so changing them changes how every stored sketch looks.

import { getStroke } from 'perfect-freehand'
import type { StrokeOptions } from 'perfect-freehand'
import type { Stroke } from './schema'

/** Soft shading: how opaque one pass is, and its blur as a share of its width. */
export const SHADE_ALPHA = 0.35
export const SHADE_BLUR = 0.3

function optionsFor(stroke: Exclude<Stroke, { tool: 'fill' }>, last: boolean): StrokeOptions {
  switch (stroke.tool) {
    case 'pencil':
      return { size: stroke.size, thinning: 0.6, smoothing: 0.5, streamline: 0.35, simulatePressure: !stroke.pen, last }
    case 'shade':
      return { size: stroke.size, thinning: 0, smoothing: 0.7, streamline: 0.5, simulatePressure: false, last }
    case 'eraser':
      return { size: stroke.size, thinning: stroke.pen ? 0.3 : 0, smoothing: 0.5, streamline: 0.3, simulatePressure: false, last }
  }
}

function triples(points: readonly number[]): [number, number, number][] {
  const out: [number, number, number][] = []
  for (let i = 0; i + 2 < points.length; i += 3) out.push([points[i]!, points[i + 1]!, points[i + 2]!])
  return out
}

/**
 * The polygon to fill, as a flat x, y list in sketch units. A fill stroke is its own outline; the others go
 * through perfect-freehand. `last` is false while the stroke is still being drawn.
 */
export function strokeOutline(stroke: Stroke, last = true): number[] {
  if (stroke.tool === 'fill') {
    const out: number[] = []
    for (let i = 0; i + 1 < stroke.points.length; i += 3) out.push(stroke.points[i]!, stroke.points[i + 1]!)
    return out
  }
  return getStroke(triples(stroke.points), optionsFor(stroke, last)).flat()
}

/** Where the outline lies, for quick checks (e.g. whether a stroke touches the disk). */
export function outlineBounds(outline: readonly number[]): { minX: number, minY: number, maxX: number, maxY: number } | null {
  if (outline.length < 2) return null
  let minX = Infinity
  let minY = Infinity
  let maxX = -Infinity
  let maxY = -Infinity
  for (let i = 0; i + 1 < outline.length; i += 2) {
    minX = Math.min(minX, outline[i]!)
    maxX = Math.max(maxX, outline[i]!)
    minY = Math.min(minY, outline[i + 1]!)
    maxY = Math.max(maxY, outline[i + 1]!)
  }
  return { minX, minY, maxX, maxY }
}
