/** How many messages the signed-in person has not read, for the header (a count, nothing else). */
export default defineEventHandler(async (event) => {
  const user = await requireActiveUser(event)
  return { unread: await unreadCountFor(user) }
})
