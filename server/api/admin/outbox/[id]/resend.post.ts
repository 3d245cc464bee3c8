import { IdParams } from '#shared/schemas/auth'

const validParams = parseWith(IdParams)

// Tries an undelivered message again now rather than at its next turn.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'admin')
  const { id } = await getValidatedRouterParams(event, validParams)
  const db = useDb()
  const outcome = await requeueMail(db, id)
  if (outcome === 'missing') throw createError({ status: 404, message: 'No such undelivered message.' })
  if (outcome === 'expired') {
    throw createError({ status: 409, message: 'The link in this message has expired; its owner can ask for a new one.' })
  }
  await audit(db, { actorId: user.id, action: 'mail.resent', subjectType: 'mail', subjectId: id })
  void drainOutbox(db)
  return { message: 'Queued to be sent now.' }
})
