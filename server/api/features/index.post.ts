import { FeatureCreateBody } from '#shared/schemas/feature'

const validBody = parseWith(FeatureCreateBody)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const input = await readValidatedBody(event, validBody)
  const db = useDb()
  const id = await createFeature(db, { name: input.name, description: input.description, proposedBy: user.id })
  await audit(db, { actorId: user.id, action: 'feature.proposed', subjectType: 'feature', subjectId: id, detail: { name: input.name } })
  setResponseStatus(event, 201)
  return { id, name: input.name, status: 'proposed' as const }
})
