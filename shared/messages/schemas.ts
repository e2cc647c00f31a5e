import { z } from 'zod'
import { ATTACHMENTS_PER_MESSAGE } from '../attachments/rules'
import { labResultSchema } from '../labs/schemas'
import { RIGHT_NOW_ITEMS } from '../triage/rules'
import { idNumber, safeText } from '../common/text'

// Error messages are locale keys under validation.messages; the client shows them at the field.
const message = (key: string) => `validation.messages.${key}`

export const MESSAGE_BODY_MAX = 4000
export const MESSAGE_SUBJECT_MAX = 120

const subject = safeText({ required_error: message('subjectRequired'), invalid_type_error: message('subjectRequired') })
  .trim().min(1, message('subjectRequired')).max(MESSAGE_SUBJECT_MAX, message('subjectTooLong'))
const body = safeText({ multiLine: true, required_error: message('bodyRequired'), invalid_type_error: message('bodyRequired') })
  .trim().min(1, message('bodyRequired')).max(MESSAGE_BODY_MAX, message('bodyTooLong'))

/**
 * A new message: into a thread (threadId) or starting one (subject), never both. `rightNow`
 * is required: the right-now danger signs the sender said yes to before sending (the page
 * asks each time; an empty list is "none of them"). When it is not empty the message is not
 * stored; the right-now path runs instead (server/api/patients/[id]/messages/index.post.ts).
 * requestId: the id the form made, the same on every retry (also the right-now entry's draft id).
 */
export const sendMessageSchema = z.object({
  threadId: idNumber(message('thread')).optional(),
  subject: subject.optional(),
  body,
  attachmentIds: z.array(idNumber(message('attachment')))
    .max(ATTACHMENTS_PER_MESSAGE, message('tooManyAttachments'))
    .refine(ids => new Set(ids).size === ids.length, message('attachment'))
    .default([]),
  rightNow: z.array(z.enum(RIGHT_NOW_ITEMS, { errorMap: () => ({ message: message('rightNow') }) }), { required_error: message('rightNowRequired'), invalid_type_error: message('rightNowRequired') })
    .refine(items => new Set(items).size === items.length, message('rightNow')),
  requestId: z.string({ required_error: message('requestId'), invalid_type_error: message('requestId') }).uuid(message('requestId')),
}).strict().superRefine((input, ctx) => {
  if ((input.threadId === undefined) === (input.subject === undefined)) {
    ctx.addIssue({ code: z.ZodIssueCode.custom, path: [input.threadId === undefined ? 'subject' : 'threadId'], message: message('threadOrSubject') })
  }
})
export type SendMessageInput = z.infer<typeof sendMessageSchema>

/** Marking his messages in a thread as read. */
export const readThreadSchema = z.object({ threadId: idNumber(message('thread')) }).strict()

/** Staff mark a message entered in error: it stays in the record with the reason. */
export const enteredInErrorSchema = z.object({
  reason: safeText({ multiLine: true, required_error: message('reasonRequired'), invalid_type_error: message('reasonRequired') })
    .trim().min(1, message('reasonRequired')).max(500, message('reasonTooLong')),
}).strict()

/**
 * Staff file an attachment into the record: an outside report becomes a lab result (the
 * lab form's fields, `today` in the clinic's zone) with the file attached.
 */
export function fileAttachmentSchema(today: string) {
  return z.object({ as: z.literal('lab-result', { errorMap: () => ({ message: message('fileAs') }) }) }).and(labResultSchema(today))
}
