/**
 * A staff page about one patient: his id from the route parameter `param`, his record
 * (name, clinic number, date of birth) fetched under the key every such page shares, and
 * `state` for AppLoadState (v-bind): the record, or "not found" when it cannot be had.
 */
export async function usePatientPageRecord(param: string) {
  const { t } = useI18n()
  const route = useRoute()
  const id = computed(() => Number(route.params[param]) || 0)
  const { data: patient, error } = await useFetch(() => `/api/patients/${id.value}`, { key: computed(() => `patient-${id.value}`) })
  const state = computed(() => ({ data: patient.value, error: error.value, failure: t('errors.notFound') }))
  return { id, patient, state }
}
