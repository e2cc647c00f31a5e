import type { PatientContactView } from '#shared/contact/views'

/** How the care team reaches him: his phones, the best times to call, his preference. */
export default defineEventHandler(async (event): Promise<PatientContactView> => {
  const { patient } = await authorizePatient(event, idParam(event), 'patient.read')
  return contactOf(patient)
})
