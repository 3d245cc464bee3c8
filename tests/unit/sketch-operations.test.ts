// Saves as operations: the steps the editor works out from the drawing the server confirmed must rebuild
// exactly the editor's drawing when the server applies them, whatever the observer did meanwhile (drew,
// undid, cleared, turned the view). Where no short list of steps does, the editor must fall back to a whole
// save rather than send steps that rebuild something else.

import { describe, expect, it } from 'vitest'
import { lunarCircumstances } from '../../shared/lunar'
import { mapStrokes } from '../../shared/sketch/strokes'
import { reframer } from '../../shared/sketch/frame'
import { StepError, applySteps, stepsBetween } from '../../shared/sketch/operations'
import type { DrawingState } from '../../shared/sketch/operations'
import type { Stroke } from '../../shared/sketch/schema'

// An evening near first quarter at an invented site (the demo club's field).
const geometry = lunarCircumstances(new Date('2026-02-23T19:00:00Z'), { latitude: 52.634, longitude: -1.692, elevation: 95 })
const ZENITH = { orientation: 'zenith-up', flip: 'none' } as const
const NORTH = { orientation: 'north-up', flip: 'none' } as const

const stroke = (id: string, x: number): Stroke => Object.freeze({ id, tool: 'pencil', tone: 1, size: 6, pen: false, points: [x, 900, 0.5, x + 30, 930, 0.5, x + 60, 980, 0.5] })
const [a, b, c, d] = [stroke('a', 700), stroke('b', 800), stroke('c', 900), stroke('d', 1000)]
const state = (strokes: Stroke[], view: DrawingState['view'] = ZENITH): DrawingState => ({ strokes, view })
const ids = (s: DrawingState) => s.strokes.map(x => x.id)

/** The steps from `from` to `to`, checked to rebuild `to` exactly when applied. */
function roundTrip(from: DrawingState, to: DrawingState) {
  const steps = stepsBetween(from, to, geometry)
  expect(steps).not.toBeNull()
  const rebuilt = applySteps(from, steps!, geometry)
  expect(rebuilt.strokes).toEqual(to.strokes)
  expect(rebuilt.view).toEqual(to.view)
  return steps!
}

describe('steps between the confirmed drawing and the editor\'s', () => {
  it('sends only the new strokes after drawing', () => {
    expect(roundTrip(state([a, b]), state([a, b, c, d]))).toEqual([{ op: 'add', stroke: c }, { op: 'add', stroke: d }])
  })

  it('sends a removal after an undo, and nothing when undone back to the confirmed drawing', () => {
    expect(roundTrip(state([a, b, c]), state([a, b]))).toEqual([{ op: 'remove', id: 'c' }])
    expect(stepsBetween(state([a, b]), state([a, b]), geometry)).toEqual([])
  })

  it('sends removals for a cleared page, and the strokes again when the clearing is undone', () => {
    expect(roundTrip(state([a, b]), state([]))).toEqual([{ op: 'remove', id: 'a' }, { op: 'remove', id: 'b' }])
    expect(roundTrip(state([]), state([a, b]))).toHaveLength(2)
    // An order that appending cannot reach (older strokes above a newer one) makes a whole save.
    expect(stepsBetween(state([a, b, c]), state([c, a, b]), geometry)).toBeNull()
  })

  it('sends a turn of the view instead of every turned stroke, with strokes drawn after the turn as drawn', () => {
    const turned = mapStrokes([a, b], reframer(geometry, ZENITH, NORTH))
    const steps = roundTrip(state([a, b]), state([...turned, c], NORTH))
    expect(steps).toEqual([{ op: 'view', orientation: 'north-up', flip: 'none' }, { op: 'add', stroke: c }])
    // A turn is a rotation about the disk's centre: every point keeps its distance from it.
    const before = Math.hypot(a.points[0]! - 1024, a.points[1]! - 1024)
    expect(Math.hypot(turned[0]!.points[0]! - 1024, turned[0]!.points[1]! - 1024)).toBeCloseTo(before, 0)
  })
})

describe('applying steps', () => {
  it('refuses a stroke that is not there, or is there already, naming the step', () => {
    expect(() => applySteps(state([a]), [{ op: 'remove', id: 'zz' }], geometry)).toThrow(StepError)
    expect(() => applySteps(state([a]), [{ op: 'add', stroke: b }, { op: 'add', stroke: b }], geometry)).toThrow(/Step 1: stroke b is already/)
  })

  it('applies steps in order: a stroke removed and drawn again goes to the top', () => {
    expect(ids(applySteps(state([a, b, c]), [{ op: 'remove', id: 'a' }, { op: 'add', stroke: a }], geometry))).toEqual(['b', 'c', 'a'])
  })

  it('leaves the drawing it was given unchanged', () => {
    const before = state([a, b])
    applySteps(before, [{ op: 'remove', id: 'a' }, { op: 'view', ...NORTH }], geometry)
    expect(ids(before)).toEqual(['a', 'b'])
    expect(before.view).toEqual(ZENITH)
  })
})
