import { IdParams } from '#shared/schemas/auth'
import { FeaturePatchBody } from '#shared/schemas/feature'

const validParams = parseWith(IdParams)
const validBody = parseWith(FeaturePatchBody)

// Moderators curate: confirm, rename (the old name stays as an alias), describe, link to a reference formation.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'moderator')
  const { id } = await getValidatedRouterParams(event, validParams)
  const change = await readValidatedBody(event, validBody)
  const db = useDb()
  const feature = await db.selectFrom('features').selectAll().where('id', '=', id).where('merged_into', 'is', null).executeTakeFirst()
  if (!feature) throw createError({ status: 404, message: 'No such feature.' })
  if (change.formationId && !(await formationById(db, change.formationId))) {
    throw createError({ status: 400, message: 'formationId: No such formation.', data: { fields: { formationId: 'No such formation.' } } })
  }
  if (change.name && change.name !== feature.name) await renameFeature(db, id, change.name)
  if (change.description !== undefined || change.status || change.formationId !== undefined) {
    await db.updateTable('features').set({
      ...(change.description !== undefined ? { description: change.description } : {}),
      ...(change.status ? { status: change.status } : {}),
      ...(change.formationId !== undefined ? { formation_id: change.formationId } : {}),
      updated_at: nowIso(),
    }).where('id', '=', id).execute()
  }
  await audit(db, { actorId: user.id, action: 'feature.changed', subjectType: 'feature', subjectId: id, detail: change })
  return { message: 'Saved.' }
})
