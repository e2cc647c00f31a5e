/** Public clinic facts every page may show (name, emergency number, crisis line). */
export function useClinic() {
  return useFetch('/api/clinic', {
    key: 'clinic',
    default: () => ({ clinicName: '', emergencyNumber: '911', crisisLine: '988', timeZone: 'America/Chicago', routineResponseWorkingDays: 3 }),
  })
}
