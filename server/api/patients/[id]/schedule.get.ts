/**
 * Where the patient stands: next due date, the window around it, the state in words' key,
 * the suggested site, the flare watch and the next appointment with its status.
 */
export default defineEventHandler(async (event) => {
  const access = await authorizePatient(event, idParam(event), 'patient.read')
  return patientScheduleView(access, await scheduleClock())
})
