import { ObservationBody } from '#shared/schemas/observation'

const validate = parseWith(ObservationBody)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const input = await readValidatedBody(event, validate)
  const site = await chosenSite(user.id, input.siteId)
  const { fields, measurements } = buildObservation(input, site)
  const id = newId()
  const at = nowIso()
  const db = useDb()
  await db.transaction().execute(async (trx) => {
    await trx.insertInto('observations').values({ id, user_id: user.id, ...fields, created_at: at, updated_at: at }).execute()
    await replaceMeasurements(trx, id, measurements)
  })
  const [dto] = await loadObservationDtos(db, [await ownObservation(user.id, id)])
  setResponseStatus(event, 201)
  return dto
})
