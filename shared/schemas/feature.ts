import { z } from 'zod'
import { nameProblem } from '../features/names'

export const FeatureName = z.string().superRefine((name, ctx) => {
  const problem = nameProblem(name)
  if (problem) ctx.addIssue({ code: 'custom', message: problem })
}).transform(name => name.trim())

const Description = z.string().trim().max(1000, 'Keep the description under 1000 characters.')

export const FeatureCreateBody = z.object({
  name: FeatureName,
  description: Description.default(''),
})

/** A reference formation's slug, e.g. "mare-imbrium". */
export const FormationId = z.string().regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'Unknown formation.').max(80, 'Unknown formation.')

export const FeaturePatchBody = z.object({
  name: FeatureName.optional(),
  description: Description.optional(),
  status: z.enum(['proposed', 'confirmed']).optional(),
  /** Links the feature to the reference formation it stands for; null unlinks. */
  formationId: FormationId.nullable().optional(),
}).refine(b => b.name !== undefined || b.description !== undefined || b.status !== undefined || b.formationId !== undefined, 'Nothing to change.')

export const FormationParams = z.object({ id: FormationId })

export const FormationListQuery = z.object({
  q: z.string().max(80).optional(),
})

export const MergeBody = z.object({ into: z.uuid('Choose the feature to merge into.') })

export const FeatureListQuery = z.object({
  q: z.string().max(80).optional(),
  status: z.enum(['proposed', 'confirmed']).optional(),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
  perPage: z.coerce.number().int().min(1).max(100).default(30),
})

export const TerminatorQuery = z.object({
  colongitude: z.coerce.number().min(0).max(360),
  subSolarLat: z.coerce.number().min(-2).max(2).default(0),
  within: z.coerce.number().min(1).max(30).default(10),
})

// A pin is placed in unit-disk coordinates of the sketch's view; a little slack past 1 is refused with a
// clear message by the projection rather than by the schema.
export const TagBody = z.object({
  x: z.number().min(-1.5).max(1.5),
  y: z.number().min(-1.5).max(1.5),
  /** The view the pin was placed in, when the editor's view differs from the one last saved. */
  orientation: z.enum(['north-up', 'zenith-up']).optional(),
  flip: z.enum(['none', 'inverted', 'mirrored']).optional(),
  featureId: z.uuid().optional(),
  name: FeatureName.optional(),
  /** Takes a reference formation's standard name. */
  formationId: FormationId.optional(),
}).refine(b => [b.featureId, b.name, b.formationId].filter(v => v !== undefined).length === 1, 'Pick an existing feature, a standard name or give a new name: one of them.')

export const TagParams = z.object({ id: z.uuid('Unknown id.'), tagId: z.uuid('Unknown id.') })
