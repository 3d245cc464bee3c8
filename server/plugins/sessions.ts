// The session routes nuxt-auth-utils adds (GET and DELETE /api/_auth/session) follow the server-side
// sessions too: an ended session reads as signed out, and clearing the cookie ends its session.
export default defineNitroPlugin(() => {
  sessionHooks.hook('fetch', async (session, event) => {
    const user = await currentUser(event)
    if (!user) throw createError({ status: 401, message: 'Please sign in.' })
    session.user = toSessionUser(user)
  })
  sessionHooks.hook('clear', async (session) => {
    if (session.sid) await useDb().deleteFrom('user_sessions').where('id', '=', session.sid).execute()
  })
})
