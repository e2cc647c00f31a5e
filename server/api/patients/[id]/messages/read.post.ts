import { readThreadSchema } from '#shared/messages/schemas'

/** Marks the messages of one thread as read by the asker (read receipts, unread counts). */
export default defineEventHandler(async (event) => {
  const access = await authorizePatient(event, idParam(event), 'message.read')
  const input = await readValidatedBody(event, parseWith(readThreadSchema))
  const sequelize = await useDb()
  const marked = await sequelize.transaction(transaction => markThreadRead(access, input.threadId, new Date(), transaction))
  return { marked }
})
