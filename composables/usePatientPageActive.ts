import type { AsyncDataRequestStatus } from '#app'
import type { Ref } from 'vue'

/**
 * A patient's own page (he or a caregiver helping him): its title (the string `titleKey`, or
 * for a caregiver `caregiverTitleKey` with the man's name when given), set as the page's, and whose
 * record is open, the fetch options for one part of it (keyed by his id, fetched only when
 * there is someone), the clinic's public facts (`clinic`: its zone and emergency number, already
 * loaded by the layout), and `gate(status)` for AppLoadState (v-bind): "nobody to show" without
 * a record, "loading" until a switched-to man's own data arrives. Synchronous, and given the
 * awaited `useActivePatient()` record: the page awaits at its top level, where Nuxt keeps
 * its context for the useHead and watch calls made here (after an await inside a composable
 * it would be lost and the server answer 500).
 */
export function usePatientPageActive(record: Awaited<ReturnType<typeof useActivePatient>>, titleKey: string, caregiverTitleKey?: string) {
  const { t } = useI18n()
  const { patientId, active, isCaregiver } = record
  const title = computed(() => caregiverTitleKey && isCaregiver.value && active.value
    ? t(caregiverTitleKey, { name: active.value.name })
    : t(titleKey))
  useHead({ title })
  const partOptions = (part: string) => ({
    key: computed(() => `${part}-${patientId.value ?? 0}`),
    immediate: patientId.value !== null,
  })
  function gate(status: Ref<AsyncDataRequestStatus>) {
    const switching = useStillShowingPrevious(patientId, status)
    return computed(() => ({ missing: active.value ? undefined : t('diary.new.noPatient'), loading: switching.value }))
  }
  const { data: clinic } = useClinic()
  return { ...record, title, clinic, partOptions, gate }
}
