// The stored drawing of a sketch. The server validates every save with these schemas, and the editor builds
// its strokes with the same types, so what one side makes the other accepts.

import { z } from 'zod'
import { COORDINATE_MAX, COORDINATE_MIN, DISK_RADIUS, SKETCH_SIZE } from './frame'

export const SHAPES_SCHEMA_VERSION = 1

export const SKETCH_TOOLS = ['pencil', 'shade', 'eraser', 'fill'] as const
export type SketchTool = (typeof SKETCH_TOOLS)[number]

/** Bounds that keep one save within what the server and a tablet handle comfortably. */
export const SHAPE_LIMITS = {
  strokes: 5000,
  pointsPerStroke: 4000,
  totalPoints: 400_000,
} as const

/** Stroke widths in sketch units, per tool. */
export const SIZE_RANGE: Record<Exclude<SketchTool, 'fill'>, { min: number, max: number }> = {
  pencil: { min: 1, max: 48 },
  shade: { min: 16, max: 320 },
  eraser: { min: 4, max: 320 },
}

export const StrokeId = z.string().regex(/^[\w-]{1,40}$/, 'A stroke id is 1–40 letters, digits, - or _.')
const Tone = z.number().min(0, 'A tone runs from 0 (dark) to 1 (lit).').max(1, 'A tone runs from 0 (dark) to 1 (lit).')
const Size = (tool: keyof typeof SIZE_RANGE) => z.number()
  .min(SIZE_RANGE[tool].min, `A ${tool} is ${SIZE_RANGE[tool].min} to ${SIZE_RANGE[tool].max} units wide.`)
  .max(SIZE_RANGE[tool].max, `A ${tool} is ${SIZE_RANGE[tool].min} to ${SIZE_RANGE[tool].max} units wide.`)

/**
 * Points are a flat list of (x, y, pressure) triples: x and y in sketch units, pressure 0..1. A loop rather
 * than a schema per number keeps a 200,000-point save quick to check.
 */
function Points(minPoints: number) {
  return z.custom<number[]>(value => Array.isArray(value), 'Points are a list of numbers.').superRefine((list, ctx) => {
    if (list.length % 3 !== 0) {
      ctx.addIssue({ code: 'custom', message: 'Points come as x, y, pressure triples.' })
      return
    }
    const count = list.length / 3
    if (count < minPoints || count > SHAPE_LIMITS.pointsPerStroke) {
      ctx.addIssue({ code: 'custom', message: `A stroke has ${minPoints} to ${SHAPE_LIMITS.pointsPerStroke} points; this one has ${count}.` })
      return
    }
    for (let i = 0; i < list.length; i += 3) {
      const x: unknown = list[i]
      const y: unknown = list[i + 1]
      const p: unknown = list[i + 2]
      if (typeof x !== 'number' || typeof y !== 'number' || typeof p !== 'number'
        || !Number.isFinite(x) || !Number.isFinite(y) || !Number.isFinite(p)) {
        ctx.addIssue({ code: 'custom', message: `Point ${i / 3} has a value that is not a number.` })
        return
      }
      if (x < COORDINATE_MIN || x > COORDINATE_MAX || y < COORDINATE_MIN || y > COORDINATE_MAX) {
        ctx.addIssue({ code: 'custom', message: `Point ${i / 3} lies outside the sketch (${COORDINATE_MIN}..${COORDINATE_MAX}).` })
        return
      }
      if (p < 0 || p > 1) {
        ctx.addIssue({ code: 'custom', message: `Point ${i / 3} has a pressure outside 0..1.` })
        return
      }
    }
  })
}

export const PencilStroke = z.strictObject({
  id: StrokeId,
  tool: z.literal('pencil'),
  tone: Tone,
  size: Size('pencil'),
  /** True when the pressures came from a pen; mouse and finger strokes take their width from speed. */
  pen: z.boolean(),
  points: Points(1),
})

export const ShadeStroke = z.strictObject({
  id: StrokeId,
  tool: z.literal('shade'),
  tone: Tone,
  size: Size('shade'),
  points: Points(1),
})

export const EraserStroke = z.strictObject({
  id: StrokeId,
  tool: z.literal('eraser'),
  size: Size('eraser'),
  pen: z.boolean(),
  points: Points(1),
})

/** A closed outline filled with one tone: the quick way to lay down a large dark area. */
export const FillStroke = z.strictObject({
  id: StrokeId,
  tool: z.literal('fill'),
  tone: Tone,
  points: Points(3),
})

export const Stroke = z.discriminatedUnion('tool', [PencilStroke, ShadeStroke, EraserStroke, FillStroke], {
  error: `A stroke's tool is one of ${SKETCH_TOOLS.join(', ')}.`,
})

// Strict objects: an unknown key is refused rather than dropped, so a save's text can be stored as sent.
export const SketchShapes = z.strictObject({
  schemaVersion: z.literal(SHAPES_SCHEMA_VERSION, `This editor reads drawings of schema version ${SHAPES_SCHEMA_VERSION}.`),
  frame: z.strictObject({
    size: z.literal(SKETCH_SIZE),
    diskRadius: z.literal(DISK_RADIUS),
  }),
  strokes: z.array(Stroke).max(SHAPE_LIMITS.strokes, `A sketch holds at most ${SHAPE_LIMITS.strokes} strokes.`),
}).superRefine((shapes, ctx) => {
  let total = 0
  const ids = new Set<string>()
  for (const stroke of shapes.strokes) {
    total += stroke.points.length / 3
    if (ids.has(stroke.id)) ctx.addIssue({ code: 'custom', path: ['strokes'], message: `Stroke id ${stroke.id} appears twice.` })
    ids.add(stroke.id)
  }
  if (total > SHAPE_LIMITS.totalPoints) {
    ctx.addIssue({ code: 'custom', path: ['strokes'], message: `A sketch holds at most ${SHAPE_LIMITS.totalPoints} points; this one has ${total}.` })
  }
})

export type PencilStroke = z.infer<typeof PencilStroke>
export type ShadeStroke = z.infer<typeof ShadeStroke>
export type EraserStroke = z.infer<typeof EraserStroke>
export type FillStroke = z.infer<typeof FillStroke>
export type Stroke = z.infer<typeof Stroke>
export type SketchShapes = z.infer<typeof SketchShapes>

export function emptyShapes(): SketchShapes {
  return { schemaVersion: SHAPES_SCHEMA_VERSION, frame: { size: SKETCH_SIZE, diskRadius: DISK_RADIUS }, strokes: [] }
}

export const SketchOrientation = z.enum(['north-up', 'zenith-up'], { error: 'The view is north-up or zenith-up.' })
export const SketchFlip = z.enum(['none', 'inverted', 'mirrored'], { error: 'The flip is none, inverted or mirrored.' })

export const CreateSketchBody = z.object({
  observationId: z.uuid('Choose one of your observations.'),
})

export const SketchIdParams = z.object({ id: z.uuid('Unknown sketch.') })

export const ThumbnailQuery = z.object({
  size: z.enum(['256', '512'], { error: 'A thumbnail is 256 or 512 pixels.' }).default('256'),
})

/** The drawing as sent in a save: JSON text, parsed and checked against the shapes schema. */
export const SketchShapesText = z.string().transform((text, ctx) => {
  try {
    return JSON.parse(text) as unknown
  }
  catch {
    ctx.addIssue({ code: 'custom', message: 'The drawing is not valid JSON.' })
    return z.NEVER
  }
}).pipe(SketchShapes)

/**
 * The small text fields of a save (multipart): the version the editor started from, an id that makes a
 * retried upload land once, and the view the strokes are drawn in.
 */
export const SaveSketchHead = z.object({
  baseVersion: z.coerce.number().int().min(1, 'baseVersion is the version you started from.'),
  saveId: z.uuid('saveId must be a UUID.'),
  orientation: SketchOrientation,
  flip: SketchFlip,
})

/** Every text field of a save, the drawing included. */
export const SaveSketchFields = SaveSketchHead.extend({ shapes: SketchShapesText })

export type SaveSketchFields = z.infer<typeof SaveSketchFields>

/** A save of the whole drawing as JSON: the first save, one whose base the editor lost, "keep mine". */
export const FullSaveBody = z.strictObject({
  baseVersion: z.number().int().min(1, 'baseVersion is the version you started from.'),
  saveId: z.uuid('saveId must be a UUID.'),
  orientation: SketchOrientation,
  flip: SketchFlip,
  shapes: SketchShapes,
})
export type FullSaveBody = z.infer<typeof FullSaveBody>

export const RevisionParams = z.object({
  id: z.uuid('Unknown sketch.'),
  version: z.coerce.number({ error: 'A version is a whole number.' }).int('A version is a whole number.').min(1, 'Versions start at 1.'),
})

/** Bringing back an earlier version makes it the next one, on top of the version the page showed. */
export const RestoreBody = z.strictObject({
  baseVersion: z.number().int().min(1, 'baseVersion is the version you started from.'),
  saveId: z.uuid('saveId must be a UUID.'),
})

export const SketchListQuery = z.object({
  page: z.coerce.number().int().min(1).max(10_000).default(1),
  perPage: z.coerce.number().int().min(1).max(100).default(24),
})
