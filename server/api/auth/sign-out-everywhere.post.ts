// For a lost phone or a shared computer: every session of the account ends, this one included.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const db = useDb()
  await endSessions(db, user.id)
  await clearUserSession(event, sessionConfig(event))
  await audit(db, { actorId: user.id, action: 'user.signed-out-everywhere', subjectType: 'user', subjectId: user.id })
  return { message: 'Signed out on every device.' }
})
