/** One visit with its checks, kits and outcome (nurses and clinicians). */
export default defineEventHandler(async (event) => {
  const { patient } = await authorizePatient(event, idParam(event), 'injection.record')
  const visit = await findVisit(event, patient)
  return visitView(visit, patient, await scheduleClock())
})
