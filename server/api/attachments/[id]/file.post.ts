import { Op } from 'sequelize'
import { fileAttachmentSchema } from '#shared/messages/schemas'
import { Attachment } from '../../../db/models'

/**
 * Nurses and clinicians file an attachment into the record: an outside report (a PSA from
 * another lab) becomes a lab result, entered with the lab form's fields, with the file
 * attached to it. The result is triaged like one typed in. A file already filed answers 409.
 */
export default defineEventHandler(async (event) => {
  const user = await requireActiveUser(event)
  const attachment = await findAttachment(idParam(event)).catch(() => null)
  const { patient } = await authorizePatient(event, attachment?.patientId ?? 0, 'message.manage', user)
  if (!attachment || !await mayOpenAttachment(attachment, user)) throw createError({ statusCode: 404, message: 'errors.notFound' })
  const clock = await scheduleClock()
  const input = await readValidatedBody(event, parseWith(fileAttachmentSchema(clock.today)))

  const sequelize = await useDb()
  const view = await sequelize.transaction(async (transaction) => {
    const { result, view } = await recordLabResult({ patientId: patient.id, enteredBy: user, result: input, clock }, transaction)
    const [changed] = await Attachment.update({ labResultId: result.id }, { where: { id: attachment.id, labResultId: { [Op.is]: null } }, transaction })
    if (changed !== 1) throw createError({ statusCode: 409, message: 'errors.attachmentAlreadyFiled' })
    await recordAudit(event, { actor: user, patientId: patient.id, action: 'attachment.file', resource: `attachment:${attachment.id}` }, transaction)
    return view
  })
  setResponseStatus(event, 201)
  return { attachmentId: attachment.id, labResult: view }
})
