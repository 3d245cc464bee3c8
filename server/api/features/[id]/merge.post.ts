import { IdParams } from '#shared/schemas/auth'
import { MergeBody } from '#shared/schemas/feature'

const validParams = parseWith(IdParams)
const validBody = parseWith(MergeBody)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'moderator')
  const { id } = await getValidatedRouterParams(event, validParams)
  const { into } = await readValidatedBody(event, validBody)
  const db = useDb()
  await mergeFeatures(db, id, into)
  forgetAtlasPages()
  await audit(db, { actorId: user.id, action: 'feature.merged', subjectType: 'feature', subjectId: id, detail: { into } })
  return { mergedInto: into }
})
