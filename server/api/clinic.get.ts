/** Public facts about the clinic, shown on every page (no patient data), and the routine response time the diary's note step names. */
export default defineEventHandler(async () => {
  const settings = await getSettings()
  return {
    clinicName: settings.clinicName,
    emergencyNumber: settings.emergencyNumber,
    crisisLine: settings.crisisLine,
    timeZone: settings.timeZone,
    routineResponseWorkingDays: settings.routineResponseWorkingDays,
  }
})
