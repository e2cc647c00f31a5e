import { Patient, User } from '../../db/models'

/** The clinic roster (staff). */
export default defineEventHandler(async (event) => {
  const actor = await requireRole(event, ['nurse', 'clinician', 'admin'])
  const patients = await Patient.findAll({ include: [{ model: User, as: 'user' }], order: [['clinicNumber', 'ASC']] })
  await recordAudit(event, { actor, patientId: null, action: 'roster.read', resource: event.path })
  return patients.map(p => ({ id: p.id, clinicNumber: p.clinicNumber, name: p.user?.name ?? '', dateOfBirth: p.dateOfBirth, active: p.user?.active ?? false }))
})
