import { patientContactSchema } from '#shared/contact/schemas'
import type { PatientContactView } from '#shared/contact/views'

/** Sets his phones, best times to call and preferred contact (the patient himself, or staff). */
export default defineEventHandler(async (event): Promise<PatientContactView> => {
  const { patient } = await authorizePatient(event, idParam(event), 'contact.manage')
  const contact = await readValidatedBody(event, parseWith(patientContactSchema))
  await patient.update({ phones: contact.phones, bestTimesToCall: contact.bestTimes, preferredContact: contact.preferred })
  return contactOf(patient)
})
