import { sendMessageSchema } from '#shared/messages/schemas'
import type { RightNowAnswer } from '#shared/messages/views'

/**
 * Sends a message to the care team (the patient, a caregiver allowed to message) or to the
 * patient's circle (nurses and clinicians), into a thread or starting one with a subject.
 *
 * Safety by construction: the sender answers the right-now check first (`rightNow`, the
 * danger signs he said yes to). Any yes stores no message: the right-now path runs instead,
 * as from the diary (an emergency entry, its queue item and the alert to the nurses on duty),
 * and the answer is 202 { rightNow: true, entryId } so the page shows what to do now.
 *
 * Otherwise 201 with the message; the same requestId again answers 200 with the first one
 * and sends nothing more. A message from the circle opens a routine queue item (or joins the
 * thread's open one) and e-mails the nurses on duty; one from staff e-mails the patient and
 * the caregivers allowed to message. No e-mail carries the message or the patient's name.
 */
export default defineEventHandler(async (event) => {
  const access = await authorizePatient(event, idParam(event), 'message.write')
  const input = await readValidatedBody(event, parseWith(sendMessageSchema))
  const { patient, user } = access
  const at = new Date()

  if (input.rightNow.length) {
    // The right-now check is asked of the patient's circle; the care team has other ways.
    if (!fromCircle(user.role)) throw fieldError('rightNow', 'validation.messages.rightNowStaff')
    const { entry } = await inDraftTransaction(transaction => reportRightNow({ patient, enteredBy: user, draftId: input.requestId, items: input.rightNow, at }, transaction))
    setResponseStatus(event, 202)
    return { rightNow: true, entryId: entry.id } satisfies RightNowAnswer
  }

  const { message, created } = await inDraftTransaction(async (transaction) => {
    const sent = await sendMessage(access, input, at, transaction)
    if (sent.created) await recordAudit(event, { actor: user, patientId: patient.id, action: 'message.send', resource: `message:${sent.message.id}` }, transaction)
    return sent
  })
  setResponseStatus(event, created ? 201 : 200)
  return sentMessageView(access, message.id)
})
