import { Patient, User } from '../../db/models'

/** The clinic roster (staff). */
export default defineEventHandler(async (event) => {
  const actor = await requireRole(event, ['nurse', 'clinician', 'admin'])
  const patients = await Patient.findAll({ include: [{ model: User, as: 'user' }], order: [['clinicNumber', 'ASC']] })
  // One line per patient listed (audit.ts recordListAudit).
  await recordListAudit(event, { actor, action: 'roster.read', resource: `${event.method} ${event.path}` }, patients.map(p => p.id))
  return patients.map(p => ({ id: p.id, clinicNumber: p.clinicNumber, name: p.user?.name ?? '', dateOfBirth: p.dateOfBirth, active: p.user?.active ?? false }))
})
