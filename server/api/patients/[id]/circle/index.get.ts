import { Op } from 'sequelize'
import { CareGrant, CircleInvitation, User } from '../../../../db/models'

/** The patient's care circle: caregivers with their permissions, and invitations not yet accepted. */
export default defineEventHandler(async (event) => {
  const { patient, allows } = await authorizePatient(event, idParam(event), 'circle.read')
  const [grants, invitations] = await Promise.all([
    CareGrant.findAll({ where: { patientId: patient.id, revokedAt: { [Op.is]: null } }, include: GRANT_PEOPLE, order: [['id', 'ASC']] }),
    CircleInvitation.findAll({ where: { patientId: patient.id, status: 'pending' }, include: [{ model: User, as: 'invitedBy' }], order: [['id', 'ASC']] }),
  ])
  return {
    canManage: allows('circle.manage'),
    members: grants.map(shapeGrant),
    invitations: invitations.map(invitation => shapeInvitation(invitation)),
  }
})
