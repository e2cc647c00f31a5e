import { Op } from 'sequelize'
import { enteredInErrorSchema } from '#shared/messages/schemas'
import { Message } from '../../../db/models'

/**
 * Nurses and clinicians mark a message entered in error, with the reason. Nobody deletes a
 * message: it stays in the record (staff see it marked, with who, when and why) and leaves
 * the patient's view; the change is in the audit trail. A second mark answers 409.
 */
export default defineEventHandler(async (event) => {
  const user = await requireActiveUser(event)
  const found = await Message.findByPk(idParam(event), { attributes: ['id', 'patientId'] })
  const { patient } = await authorizePatient(event, found?.patientId ?? 0, 'message.manage', user)
  const input = await readValidatedBody(event, parseWith(enteredInErrorSchema))
  const at = new Date()

  const sequelize = await useDb()
  await sequelize.transaction(async (transaction) => {
    const [changed] = await Message.update(
      { enteredInErrorAt: at, enteredInErrorByUserId: user.id, enteredInErrorReason: input.reason },
      { where: { id: found!.id, patientId: patient.id, enteredInErrorAt: { [Op.is]: null } }, transaction },
    )
    if (changed !== 1) throw createError({ statusCode: 409, message: 'errors.messageAlreadyInError' })
    await recordAudit(event, { actor: user, patientId: patient.id, action: 'message.entered-in-error', resource: `message:${found!.id}` }, transaction)
  })
  return { id: found!.id, enteredInError: { at: at.toISOString(), by: user.name, reason: input.reason } }
})
