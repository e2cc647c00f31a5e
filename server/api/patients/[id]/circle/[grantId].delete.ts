import { Op } from 'sequelize'
import { CareGrant } from '../../../../db/models'

/**
 * Removes a caregiver from the circle. The access policy reads the grant on every request,
 * so his very next request is refused; the grant row stays as history. The caregiver is
 * e-mailed that his access ended, and the patient when staff removed him.
 */
export default defineEventHandler(async (event) => {
  const { patient, user, relation } = await authorizePatient(event, idParam(event), 'circle.manage')
  const grantId = idParam(event, 'grantId')

  const sequelize = await useDb()
  await sequelize.transaction(async (transaction) => {
    const grant = await CareGrant.findOne({ where: { id: grantId, patientId: patient.id, revokedAt: { [Op.is]: null } }, transaction })
    if (!grant) throw createError({ statusCode: 404, message: 'errors.notFound' })
    await grant.update({ revokedAt: new Date(), revokedByUserId: user.id }, { transaction })
    await noticeCaregiverRemoved(grant.caregiverUserId, transaction)
    await noticeCircleChangedByStaff(relation, patient, transaction)
    await recordAudit(event, { actor: user, patientId: patient.id, action: 'circle.remove', resource: `care-grant:${grant.id}` }, transaction)
  })
  setResponseStatus(event, 204)
  return null
})
