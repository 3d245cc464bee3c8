// The shapes schema: it accepts what the editor's stroke builder makes and refuses malformed drawings.

import { describe, expect, it } from 'vitest'
import { lunarCircumstances } from '../../shared/lunar'
import { DISK_CENTRE, SKETCH_SIZE, reframer } from '../../shared/sketch/frame'
import { SHAPE_LIMITS, SaveSketchFields, SketchShapes, emptyShapes } from '../../shared/sketch/schema'
import type { Stroke } from '../../shared/sketch/schema'
import { addSample, finishStroke, mapStrokes, startStroke } from '../../shared/sketch/strokes'
import type { StrokeSettings } from '../../shared/sketch/strokes'

function drawn(settings: StrokeSettings, samples: [number, number, number][], pen = false): Stroke {
  const draft = startStroke(settings, pen)
  for (const [x, y, p] of samples) addSample(draft, x, y, p)
  const stroke = finishStroke(draft)
  if (!stroke) throw new Error('the builder made no stroke')
  return stroke
}

const arc = (cx: number, cy: number, r: number, n: number): [number, number, number][] =>
  Array.from({ length: n }, (_, i) => [cx + r * Math.cos(i / n * 5), cy + r * Math.sin(i / n * 5), 0.2 + 0.6 * (i / n)])

function withStrokes(strokes: unknown[]) {
  return { ...emptyShapes(), strokes }
}

function editorDrawing(): Stroke[] {
  return [
    drawn({ tool: 'pencil', tone: 1, size: 6 }, arc(1100, 900, 300, 80), true),
    drawn({ tool: 'pencil', tone: 0.5, size: 3 }, arc(900, 1000, 120, 40)),
    drawn({ tool: 'shade', tone: 0.25, size: 90 }, arc(1000, 1100, 200, 60)),
    drawn({ tool: 'eraser', tone: 0, size: 40 }, arc(1000, 1000, 50, 20), true),
    drawn({ tool: 'fill', tone: 0, size: 0 }, [[700, 700, 0.5], [900, 700, 0.5], [800, 950, 0.5], [690, 820, 0.5]]),
  ]
}

describe('the shapes schema accepts what the editor makes', () => {
  it('accepts pencil, shading, eraser and fill strokes from the stroke builder', () => {
    const result = SketchShapes.safeParse(withStrokes(editorDrawing()))
    expect(result.error?.issues).toBeUndefined()
    expect(result.data?.strokes.map(s => s.tool)).toEqual(['pencil', 'pencil', 'shade', 'eraser', 'fill'])
  })

  it('accepts an empty page, and survives a JSON round trip unchanged', () => {
    expect(SketchShapes.safeParse(emptyShapes()).success).toBe(true)
    const shapes = withStrokes(editorDrawing())
    expect(SketchShapes.parse(JSON.parse(JSON.stringify(shapes)))).toEqual(shapes)
  })

  it('keeps samples off the frame inside it: the builder clamps them', () => {
    const stroke = drawn({ tool: 'pencil', tone: 1, size: 4 }, [[-300, 50, 0.5], [SKETCH_SIZE + 900, 60, 0.5]])
    expect(stroke.points).toEqual([0, 50, 0.5, SKETCH_SIZE, 60, 0.5])
    expect(SketchShapes.safeParse(withStrokes([stroke])).success).toBe(true)
  })

  it('ends a stroke at the point limit instead of making one the server would refuse', () => {
    const draft = startStroke({ tool: 'pencil', tone: 1, size: 4 }, true)
    let open = true
    let samples = 0
    while (open) {
      open = addSample(draft, 10 + (samples % 2000), 10 + 2 * Math.floor(samples / 2000), 0.5)
      samples += 1
    }
    const stroke = finishStroke(draft)!
    expect(stroke.points.length / 3).toBe(SHAPE_LIMITS.pointsPerStroke)
    expect(SketchShapes.safeParse(withStrokes([stroke])).success).toBe(true)
  })

  it('accepts a drawing turned to another view, corners included', () => {
    const geometry = lunarCircumstances(new Date('2026-03-01T19:30:00Z'), { latitude: 52.634, longitude: -1.692 })
    const corners = drawn({ tool: 'pencil', tone: 1, size: 4 }, [[0, 0, 0.5], [SKETCH_SIZE, 0, 0.5], [SKETCH_SIZE, SKETCH_SIZE, 0.5], [0, SKETCH_SIZE, 0.5]])
    const turned = mapStrokes([corners, ...editorDrawing()], reframer(geometry, { orientation: 'zenith-up', flip: 'none' }, { orientation: 'north-up', flip: 'mirrored' }))
    expect(SketchShapes.safeParse(withStrokes(turned)).success).toBe(true)
    // The turn keeps every point's distance from the centre.
    const before = Math.hypot(0 - DISK_CENTRE, 0 - DISK_CENTRE)
    const after = Math.hypot(turned[0]!.points[0]! - DISK_CENTRE, turned[0]!.points[1]! - DISK_CENTRE)
    expect(after).toBeCloseTo(before, 0)
  })
})

describe('the shapes schema refuses bad drawings', () => {
  const good = () => JSON.parse(JSON.stringify(editorDrawing()[0])) as Record<string, unknown>
  const refuses = (strokes: unknown[], message: RegExp) => {
    const result = SketchShapes.safeParse(withStrokes(strokes))
    expect(result.success).toBe(false)
    expect(result.error!.issues.map(i => `${i.path.join('.')}: ${i.message}`).join(' | ')).toMatch(message)
  }

  it('refuses an unknown tool', () => {
    refuses([{ ...good(), tool: 'spray' }], /tool is one of pencil, shade, eraser, fill/)
  })

  it('refuses points that are not whole triples', () => {
    refuses([{ ...good(), points: [10, 10, 0.5, 20] }], /triples/)
  })

  it('refuses a point outside the sketch', () => {
    refuses([{ ...good(), points: [10, 10, 0.5, 99_999, 20, 0.5] }], /outside the sketch/)
    refuses([{ ...good(), points: [-600, 10, 0.5] }], /outside the sketch/)
  })

  it('refuses a pressure outside 0..1', () => {
    refuses([{ ...good(), points: [10, 10, 1.5] }], /pressure/)
  })

  it('refuses non-numbers among the points', () => {
    refuses([{ ...good(), points: [10, '10', 0.5] }], /number/i)
    refuses([{ ...good(), points: [10, null, 0.5] }], /number/i)
  })

  it('refuses a stroke with no points, and a fill of fewer than three', () => {
    refuses([{ ...good(), points: [] }], /1 to 4000 points/)
    refuses([{ id: 'f1', tool: 'fill', tone: 0, points: [1, 1, 0.5, 5, 5, 0.5] }], /3 to 4000 points/)
  })

  it('refuses a stroke over the point limit', () => {
    const points = Array.from({ length: (SHAPE_LIMITS.pointsPerStroke + 1) * 3 }, (_, i) => (i % 3 === 2 ? 0.5 : 100))
    refuses([{ ...good(), points }], /this one has 4001/)
  })

  it('refuses a drawing over the total point limit', () => {
    const points = Array.from({ length: 3000 * 3 }, (_, i) => (i % 3 === 2 ? 0.5 : 100))
    const strokes = Array.from({ length: Math.ceil(SHAPE_LIMITS.totalPoints / 3000) + 1 }, (_, i) => ({ ...good(), id: `s${i}`, points }))
    refuses(strokes, /at most 400000 points/)
  })

  it('refuses too many strokes', () => {
    const strokes = Array.from({ length: SHAPE_LIMITS.strokes + 1 }, (_, i) => ({ ...good(), id: `s${i}`, points: [1, 1, 0.5] }))
    refuses(strokes, /at most 5000 strokes/)
  })

  it('refuses widths and tones out of range, and a missing pen flag', () => {
    refuses([{ ...good(), size: 500 }], /1 to 48 units/)
    refuses([{ ...good(), tone: 2 }], /tone runs from 0/)
    const { pen: _pen, ...noPen } = good()
    refuses([noPen], /strokes\.0\.pen: .*expected boolean/)
  })

  it('refuses a repeated stroke id and a malformed one', () => {
    const once = good()
    refuses([once, { ...once }], /appears twice/)
    refuses([{ ...good(), id: 'a b<c>' }], /stroke id/)
  })

  it('refuses another schema version or frame', () => {
    expect(SketchShapes.safeParse({ ...emptyShapes(), schemaVersion: 2 }).success).toBe(false)
    expect(SketchShapes.safeParse({ ...emptyShapes(), frame: { size: 4096, diskRadius: 860 } }).success).toBe(false)
  })
})

describe('the save fields', () => {
  const fields = {
    baseVersion: '3',
    saveId: '6b1c9a64-2f57-4f55-9a3e-5d0c2b1e7a10',
    orientation: 'zenith-up',
    flip: 'mirrored',
    shapes: JSON.stringify(withStrokes(editorDrawing())),
  }

  it('reads a multipart save: the version as a number, the drawing parsed and checked', () => {
    const save = SaveSketchFields.parse(fields)
    expect(save.baseVersion).toBe(3)
    expect(save.shapes.strokes).toHaveLength(5)
  })

  it('refuses drawing text that is not JSON, and JSON that is not a drawing', () => {
    expect(SaveSketchFields.safeParse({ ...fields, shapes: '{"strokes": [' }).error?.issues[0]?.message).toMatch(/not valid JSON/)
    expect(SaveSketchFields.safeParse({ ...fields, shapes: '{"strokes": []}' }).success).toBe(false)
  })

  it('refuses an unknown view and a missing version', () => {
    expect(SaveSketchFields.safeParse({ ...fields, orientation: 'south-up' }).success).toBe(false)
    const { baseVersion: _v, ...noVersion } = fields
    expect(SaveSketchFields.safeParse(noVersion).success).toBe(false)
  })
})
