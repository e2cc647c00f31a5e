/** Ends this session (its row, so a copy of the cookie stops working too), then clears the cookie. */
export default defineEventHandler(async (event) => {
  const id = (await getUserSession(event)).secure?.sessionId
  if (id) await endSession(id, 'sign-out')
  await clearUserSession(event)
  return { ok: true }
})
