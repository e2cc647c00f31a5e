/**
 * A staff page about one patient: his id from the route parameter `param`, his record
 * (name, clinic number, date of birth) fetched under the key every such page shares, and
 * `state` for AppLoadState (v-bind): the record, or "not found" when it cannot be had. The
 * page's title is `title(name)`, with his name once the record is there (set before the
 * await, where Nuxt still has the page's context).
 */
export async function usePatientPageRecord(param: string, title: (name: string | undefined) => string) {
  const { t } = useI18n()
  const route = useRoute()
  const id = computed(() => Number(route.params[param]) || 0)
  const request = useFetch(() => `/api/patients/${id.value}`, { key: computed(() => `patient-${id.value}`) })
  useHead({ title: () => title(request.data.value?.name) })
  const { data: patient, error } = await request
  const state = computed(() => ({ data: patient.value, error: error.value, failure: t('errors.notFound') }))
  return { id, patient, state }
}
