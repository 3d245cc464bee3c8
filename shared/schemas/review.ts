import { z } from 'zod'
import { LocalDate } from './dates'
import { PHASE_NAMES } from '../observing/phases'

const Comment = z.string().max(4000, 'Comments are limited to 4000 characters.').default('')

export const SubmitBody = z.object({ comment: Comment })

export const DecisionBody = z.object({
  decision: z.enum(['approve', 'return', 'withdraw'], { error: 'Choose approve, return or withdraw.' }),
  comment: Comment,
})

const Phase = z.enum(PHASE_NAMES as [string, ...string[]])
const InstrumentKind = z.enum(['naked-eye', 'binoculars', 'telescope'])

export const QueueQuery = z.object({
  phase: Phase.optional(),
  instrument: InstrumentKind.optional(),
  observer: z.string().trim().max(80).optional(),
  sort: z.enum(['waiting', 'observed']).default('waiting'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  perPage: z.coerce.number().int().min(1).max(100).default(20),
})

export const AtlasQuery = z.object({
  phase: Phase.optional(),
  ageMin: z.coerce.number().min(0).max(30).optional(),
  ageMax: z.coerce.number().min(0).max(30).optional(),
  /** Colongitude range in degrees; a range that crosses 360° (e.g. 350 to 10) wraps. */
  colongitudeMin: z.coerce.number().min(0).max(360).optional(),
  colongitudeMax: z.coerce.number().min(0).max(360).optional(),
  feature: z.uuid().optional(),
  observer: z.uuid().optional(),
  instrument: InstrumentKind.optional(),
  from: LocalDate.optional(),
  to: LocalDate.optional(),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  perPage: z.coerce.number().int().min(1).max(60).default(24),
})

export type AtlasQuery = z.infer<typeof AtlasQuery>

export const ImageSizeQuery = z.object({
  size: z.enum(['small', 'large', 'full']).default('small'),
})
