/**
 * A staff page about one patient: his id from the route parameter `param`, and his record
 * (name, clinic number, date of birth), fetched under the key every such page shares.
 */
export async function usePatientPage(param: string) {
  const route = useRoute()
  const id = computed(() => Number(route.params[param]) || 0)
  const { data: patient, error } = await useFetch(() => `/api/patients/${id.value}`, { key: computed(() => `patient-${id.value}`) })
  return { id, patient, error }
}
