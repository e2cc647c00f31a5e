import { useActingForStore } from '~~/stores/acting-for'

/**
 * The patient record the page is about: a patient's own, or the one a caregiver chose to
 * help (the first he may help when he has not chosen). Also says what he may do there.
 */
export async function useActivePatient() {
  const { user } = useUserSession()
  const store = useActingForStore()
  const { data: records, refresh } = await useFetch('/api/me/patients', { key: `my-patients-${user.value?.id ?? 0}`, default: () => [] })
  const active = computed(() => {
    const list = records.value ?? []
    return list.find(r => r.patientId === store.selectedPatientId) ?? list[0] ?? null
  })
  return {
    records,
    refresh,
    active,
    patientId: computed(() => active.value?.patientId ?? null),
    isCaregiver: computed(() => user.value?.role === 'caregiver'),
    select: (patientId: number) => store.select(patientId),
  }
}
