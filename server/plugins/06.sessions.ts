import type { H3Event } from 'h3'

/*
 * nuxt-auth-utils' own routes follow the session rows too (server/utils/auth/sessions.ts):
 * GET /api/_auth/session, what the client reads to know who is signed in, answers 401 for
 * an ended or idle session, and DELETE /api/_auth/session (useUserSession().clear())
 * ends the row before the cookie goes, so clearing on the client alone is a real sign-out.
 */
export default defineNitroPlugin((nitroApp) => {
  // A server render's internal calls share the page request's session check (sessions.ts).
  const handler = nitroApp.h3App.handler
  nitroApp.h3App.handler = (event: H3Event) => withSessionScope(event, () => handler(event))
  sessionHooks.hook('fetch', async (session, event) => {
    if (session.user) await requireLiveSession(event, { ...session, user: session.user })
  })
  sessionHooks.hook('clear', async (session) => {
    const id = session.secure?.sessionId
    if (session.user && id) await endSession(id, 'sign-out')
  })
})
