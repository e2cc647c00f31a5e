/** Ends every session of the signed-in user, on every device, this one included. */
export default defineEventHandler(async (event) => {
  const user = await requireActiveUser(event)
  await endSessions(user.id, 'sign-out-everywhere')
  await clearUserSession(event)
  return { ok: true }
})
