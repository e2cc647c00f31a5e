import { CircleInvitation } from '../../../../../db/models'

/**
 * Withdraws an invitation that was not accepted yet; its link stops working at once. When
 * staff withdraw it, the patient is e-mailed to review his circle.
 */
export default defineEventHandler(async (event) => {
  const { patient, user, relation } = await authorizePatient(event, idParam(event), 'circle.manage')
  const invitationId = idParam(event, 'invitationId')

  const sequelize = await useDb()
  await sequelize.transaction(async (transaction) => {
    const invitation = await CircleInvitation.findOne({ where: { id: invitationId, patientId: patient.id, status: 'pending' }, transaction })
    if (!invitation) throw createError({ statusCode: 404, message: 'errors.notFound' })
    await invitation.update({ status: 'cancelled', closedAt: new Date() }, { transaction })
    await noticeCircleChangedByStaff(relation, patient, transaction)
    await recordAudit(event, { actor: user, patientId: patient.id, action: 'circle.cancel-invitation', resource: `circle-invitation:${invitation.id}` }, transaction)
  })
  setResponseStatus(event, 204)
  return null
})
