import { labResultSchema } from '#shared/labs/schemas'

/**
 * Staff (nurses and clinicians) enter one lab or ECG result. A result the clinic's lab
 * rules put at routine or above opens a triage queue item in the same transaction; urgent
 * ones also alert the nurses on duty.
 */
export default defineEventHandler(async (event) => {
  const { patient, user } = await authorizePatient(event, idParam(event), 'labs.record')
  const clock = await scheduleClock()
  const input = await readValidatedBody(event, parseWith(labResultSchema(clock.today)))

  const sequelize = await useDb()
  const { view } = await sequelize.transaction(transaction => recordLabResult({ patientId: patient.id, enteredBy: user, result: input, clock }, transaction))
  setResponseStatus(event, 201)
  return view
})
