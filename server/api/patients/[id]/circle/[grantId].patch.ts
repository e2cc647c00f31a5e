import { Op } from 'sequelize'
import { circlePermissionsSchema } from '#shared/circle/schemas'
import { CareGrant } from '../../../../db/models'

/**
 * Changes what a caregiver may do; he has the new permissions on his next request. When staff
 * make the change, the patient is e-mailed to review his circle.
 */
export default defineEventHandler(async (event) => {
  const { patient, user, relation } = await authorizePatient(event, idParam(event), 'circle.manage')
  const input = await readValidatedBody(event, parseWith(circlePermissionsSchema))
  const grantId = idParam(event, 'grantId')

  const sequelize = await useDb()
  await sequelize.transaction(async (transaction) => {
    const grant = await CareGrant.findOne({ where: { id: grantId, patientId: patient.id, revokedAt: { [Op.is]: null } }, transaction })
    if (!grant) throw createError({ statusCode: 404, message: 'errors.notFound' })
    const { canMessage, ...flags } = input
    await grant.update({ ...flags, ...(canMessage === undefined ? {} : { canMessage }), updatedByUserId: user.id }, { transaction })
    await noticeCircleChangedByStaff(relation, patient, transaction)
    await recordAudit(event, { actor: user, patientId: patient.id, action: 'circle.update', resource: `care-grant:${grant.id}` }, transaction)
  })
  const grant = await CareGrant.findByPk(grantId, { include: GRANT_PEOPLE })
  return shapeGrant(grant!)
})
