import type { LabResultsView } from '#shared/labs/views'

/** His lab and ECG results, newest first, each with its interpretation and level. */
export default defineEventHandler(async (event): Promise<LabResultsView> => {
  const { patient } = await authorizePatient(event, idParam(event), 'patient.read')
  const clock = await scheduleClock()
  const { results, context } = await labContextOf(patient.id)
  return {
    today: clock.today,
    results: results.map(result => labResultView(result, context)).reverse(),
  }
})
