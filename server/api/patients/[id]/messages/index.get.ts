/**
 * The conversations between the patient's circle and the care team: threads with their
 * messages, files and authors, and the asker's unread counts. Staff also see messages
 * entered in error (marked) and who in the circle read each staff message; the circle never
 * sees a message entered in error.
 */
export default defineEventHandler(async (event) => {
  const access = await authorizePatient(event, idParam(event), 'message.read')
  return messagesViewOf(access)
})
