import { IdParams } from '#shared/schemas/auth'
import { ObservationBody } from '#shared/schemas/observation'

const validParams = parseWith(IdParams)
const validBody = parseWith(ObservationBody)

// Saving recomputes the circumstances and the predicted values with the current model.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const { id } = await getValidatedRouterParams(event, validParams)
  const input = await readValidatedBody(event, validBody)
  await ownObservation(user.id, id)
  const db = useDb()
  await refuseIfJudged(db, id, 'changed')
  const site = await chosenSite(user.id, input.siteId)
  const { fields, measurements } = buildObservation(input, site)
  await db.transaction().execute(async (trx) => {
    await trx.updateTable('observations').set({ ...fields, updated_at: nowIso() })
      .where('id', '=', id).where('user_id', '=', user.id).execute()
    await replaceMeasurements(trx, id, measurements)
  })
  const [dto] = await loadObservationDtos(db, [await ownObservation(user.id, id)])
  return dto
})
