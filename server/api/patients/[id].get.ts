import { User } from '../../db/models'

/** One patient's basic record, for the patient, his care circle and clinic staff. */
export default defineEventHandler(async (event) => {
  const { patient } = await authorizePatient(event, idParam(event), 'patient.read')
  const user = await User.findByPk(patient.userId)
  return { id: patient.id, clinicNumber: patient.clinicNumber, dateOfBirth: patient.dateOfBirth, name: user?.name ?? '', language: user?.language ?? 'en' }
})
