import { Op } from 'sequelize'
import { CareGrant, Patient, User } from '../../db/models'

/**
 * The records the signed-in person may open as a patient or caregiver: his own, or those
 * whose owners granted him access (with what the grant allows).
 */
export default defineEventHandler(async (event) => {
  const user = await requireActiveUser(event)
  if (user.role === 'patient' && user.patientId) {
    return [{ patientId: user.patientId, name: user.name, relation: 'self' as const, canLogDiary: true, canManageAppointments: true, canMessage: true }]
  }
  if (user.role !== 'caregiver') return []
  const grants = await CareGrant.findAll({
    where: { caregiverUserId: user.id, revokedAt: { [Op.is]: null } },
    include: [{ model: Patient, as: 'patient', include: [{ model: User, as: 'user' }] }],
    order: [['id', 'ASC']],
  })
  return grants.map(grant => ({
    patientId: grant.patientId,
    name: grant.patient?.user?.name ?? '',
    relation: 'caregiver' as const,
    canLogDiary: grant.canLogDiary,
    canManageAppointments: grant.canManageAppointments,
    canMessage: grant.canMessage,
  }))
})
