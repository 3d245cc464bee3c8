// A save as the change it makes: the strokes added, the strokes taken away (undo, clearing) and turns of the
// view, in the order they happened. The editor works the steps out from the copy the server last confirmed;
// the server applies them to its copy with the same function, so both arrive at the same drawing.

import { z } from 'zod'
import type { DiskGeometry, DiskView } from '../lunar'
import { reframer, sameView } from './frame'
import { SHAPE_LIMITS, SketchFlip, SketchOrientation, Stroke, StrokeId } from './schema'
import type { Stroke as StrokeShape } from './schema'
import { mapStrokes } from './strokes'

export const AddStep = z.strictObject({ op: z.literal('add'), stroke: Stroke })
export const RemoveStep = z.strictObject({ op: z.literal('remove'), id: StrokeId })
/** Turning the template turns every stroke with it; the server turns them the same way. */
export const ViewStep = z.strictObject({ op: z.literal('view'), orientation: SketchOrientation, flip: SketchFlip })

export const SketchStep = z.discriminatedUnion('op', [AddStep, RemoveStep, ViewStep], {
  error: 'A step is add, remove or view.',
})
export type SketchStep = z.infer<typeof SketchStep>

/** More steps than this is no autosave: the editor sends a full copy instead. */
export const MAX_STEPS = SHAPE_LIMITS.strokes * 2 + 16

export const SketchOperationsBody = z.strictObject({
  baseVersion: z.number().int().min(1, 'baseVersion is the version you started from.'),
  saveId: z.uuid('saveId must be a UUID.'),
  steps: z.array(SketchStep).min(1, 'A save changes at least one thing.').max(MAX_STEPS, `A save holds at most ${MAX_STEPS} steps; send the whole drawing instead.`),
})
export type SketchOperationsBody = z.infer<typeof SketchOperationsBody>

export interface DrawingState {
  strokes: readonly StrokeShape[]
  view: DiskView
}

/** Why a list of steps cannot apply to a drawing; the server answers 400 with it and writes nothing. */
export class StepError extends Error {}

/**
 * The drawing after `steps`. Strokes are appended in order, so the painting order (which decides what an
 * eraser cuts) is the order they were drawn in. Throws StepError for a step that does not fit the drawing.
 */
export function applySteps(state: DrawingState, steps: readonly SketchStep[], geometry: DiskGeometry): DrawingState {
  let strokes = [...state.strokes]
  let view = { ...state.view }
  const ids = new Set(strokes.map(s => s.id))
  steps.forEach((step, index) => {
    switch (step.op) {
      case 'add':
        if (ids.has(step.stroke.id)) throw new StepError(`Step ${index}: stroke ${step.stroke.id} is already in the drawing.`)
        ids.add(step.stroke.id)
        strokes.push(step.stroke)
        break
      case 'remove': {
        if (!ids.has(step.id)) throw new StepError(`Step ${index}: stroke ${step.id} is not in the drawing.`)
        ids.delete(step.id)
        strokes = strokes.filter(s => s.id !== step.id)
        break
      }
      case 'view': {
        const next = { orientation: step.orientation, flip: step.flip }
        if (!sameView(view, next)) strokes = mapStrokes(strokes, reframer(geometry, view, next))
        view = next
        break
      }
    }
  })
  if (strokes.length > SHAPE_LIMITS.strokes) throw new StepError(`A sketch holds at most ${SHAPE_LIMITS.strokes} strokes.`)
  const points = strokes.reduce((sum, s) => sum + s.points.length / 3, 0)
  if (points > SHAPE_LIMITS.totalPoints) throw new StepError(`A sketch holds at most ${SHAPE_LIMITS.totalPoints} points; this one would have ${points}.`)
  return { strokes, view }
}

function sameStroke(a: StrokeShape, b: StrokeShape): boolean {
  if (a === b) return true
  if (a.id !== b.id || a.points.length !== b.points.length) return false
  return JSON.stringify(a) === JSON.stringify(b)
}

/**
 * The steps that carry `from` (the copy the server confirmed) to `to` (the editor's copy), or null when no
 * short list of steps does (the editor then saves the whole drawing). Strokes are compared by identity first:
 * they are frozen, so an unchanged stroke is the same object, and only a turn of the view makes new ones.
 */
export function stepsBetween(from: DrawingState, to: DrawingState, geometry: DiskGeometry): SketchStep[] | null {
  const steps: SketchStep[] = []
  let base = from.strokes
  if (!sameView(from.view, to.view)) {
    steps.push({ op: 'view', orientation: to.view.orientation, flip: to.view.flip })
    base = mapStrokes(from.strokes, reframer(geometry, from.view, to.view))
  }
  const wanted = new Map(to.strokes.map(s => [s.id, s]))
  const kept = new Set<string>()
  for (const stroke of base) {
    const there = wanted.get(stroke.id)
    if (there && sameStroke(stroke, there)) kept.add(stroke.id)
    else steps.push({ op: 'remove', id: stroke.id })
  }
  // What stays must keep its order and come before every new stroke, since new strokes are appended.
  const keptInTarget = to.strokes.filter(s => kept.has(s.id))
  if (keptInTarget.some((s, i) => to.strokes[i] !== s && !sameStroke(to.strokes[i]!, s))) return null
  for (const stroke of to.strokes.slice(keptInTarget.length)) steps.push({ op: 'add', stroke })
  if (steps.length > MAX_STEPS) return null
  // The same function the server runs must arrive exactly at the editor's copy, or a full save goes instead.
  try {
    const result = applySteps(from, steps, geometry)
    if (result.strokes.length !== to.strokes.length || !result.strokes.every((s, i) => sameStroke(s, to.strokes[i]!))) return null
  }
  catch {
    return null
  }
  return steps
}
