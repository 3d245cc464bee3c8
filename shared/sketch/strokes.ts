// Building strokes from pointer samples. The editor feeds every sample through here, so what it stores is
// always inside the schema's bounds: points are clamped to the frame, samples closer than a raster pixel are
// dropped, and a stroke that reaches the point limit is ended so the next samples start a new one.

import { SKETCH_SIZE, roundCoordinate, roundPressure } from './frame'
import { SHAPE_LIMITS, SIZE_RANGE } from './schema'
import type { SketchTool, Stroke } from './schema'

export interface StrokeSettings {
  tool: SketchTool
  /** 0 (dark) … 1 (lit); the eraser ignores it. */
  tone: number
  /** Width in sketch units; the fill ignores it. */
  size: number
}

export interface StrokeDraft {
  id: string
  settings: StrokeSettings
  /** Real pen pressure, rather than a mouse's or finger's constant. */
  pen: boolean
  points: number[]
}

/** Samples closer than this (sketch units, one raster pixel) add nothing visible. */
const MIN_STEP = 1

export function newStrokeId(): string {
  const bytes = new Uint8Array(9)
  crypto.getRandomValues(bytes)
  return Array.from(bytes, b => b.toString(36).padStart(2, '0')).join('').slice(0, 16)
}

export function startStroke(settings: StrokeSettings, pen: boolean, id = newStrokeId()): StrokeDraft {
  return { id, settings, pen, points: [] }
}

const clampToFrame = (value: number) => roundCoordinate(Math.min(SKETCH_SIZE, Math.max(0, value)))

/** Adds a sample; answers false once the stroke is full and should be finished. */
export function addSample(draft: StrokeDraft, x: number, y: number, pressure: number): boolean {
  if (!Number.isFinite(x) || !Number.isFinite(y)) return true
  const n = draft.points.length
  if (n / 3 >= SHAPE_LIMITS.pointsPerStroke) return false
  const px = clampToFrame(x)
  const py = clampToFrame(y)
  if (n >= 3 && Math.hypot(px - draft.points[n - 3]!, py - draft.points[n - 2]!) < MIN_STEP) return true
  draft.points.push(px, py, roundPressure(Number.isFinite(pressure) ? pressure : 0.5))
  return n / 3 + 1 < SHAPE_LIMITS.pointsPerStroke
}

function clampSize(tool: Exclude<SketchTool, 'fill'>, size: number): number {
  return Math.min(SIZE_RANGE[tool].max, Math.max(SIZE_RANGE[tool].min, Math.round(size)))
}

const clampTone = (tone: number) => Math.round(Math.min(1, Math.max(0, tone)) * 100) / 100

/** The stroke as stored, frozen; null when it has too few points to show (a fill needs three). */
export function finishStroke(draft: StrokeDraft): Stroke | null {
  const { tool, tone, size } = draft.settings
  const points = draft.points.slice()
  if (points.length < 3) return null
  let stroke: Stroke
  switch (tool) {
    case 'pencil':
      stroke = { id: draft.id, tool, tone: clampTone(tone), size: clampSize(tool, size), pen: draft.pen, points }
      break
    case 'shade':
      stroke = { id: draft.id, tool, tone: clampTone(tone), size: clampSize(tool, size), points }
      break
    case 'eraser':
      stroke = { id: draft.id, tool, size: clampSize(tool, size), pen: draft.pen, points }
      break
    case 'fill':
      if (points.length < 9) return null
      stroke = { id: draft.id, tool, tone: clampTone(tone), points }
      break
  }
  return Object.freeze(stroke)
}

/** The draft as a stroke while it is drawn, for the live preview. */
export function draftAsStroke(draft: StrokeDraft): Stroke | null {
  return finishStroke(draft)
}

/** A copy of every stroke with its points carried through `map` (a change of view). */
export function mapStrokes(strokes: readonly Stroke[], map: (x: number, y: number) => { x: number, y: number }): Stroke[] {
  return strokes.map((stroke) => {
    const points = stroke.points.slice()
    for (let i = 0; i + 1 < points.length; i += 3) {
      const p = map(points[i]!, points[i + 1]!)
      points[i] = roundCoordinate(p.x)
      points[i + 1] = roundCoordinate(p.y)
    }
    return Object.freeze({ ...stroke, points })
  })
}
