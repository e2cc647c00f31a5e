/** Staff (nurses and clinicians): his monitoring plan, what is due, the newest results and the defaults' sources. */
export default defineEventHandler(async (event) => {
  const access = await authorizePatient(event, idParam(event), 'monitoring.read')
  return monitoringPlanView(access, await scheduleClock())
})
