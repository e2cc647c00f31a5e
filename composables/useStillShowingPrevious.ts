import type { AsyncDataRequestStatus } from '#app'
import type { Ref } from 'vue'

/**
 * Whether a fetch keyed by the patient's id still holds the man shown before: a caregiver
 * switched, and Nuxt starts the new key with the previous man's data until the new man's
 * arrives. True from the switch until that fetch ends; a refresh of the same man's data
 * (after he saves a form) does not count, so his page stays as it is meanwhile.
 */
export function useStillShowingPrevious(patientId: Ref<number | null>, status: Ref<AsyncDataRequestStatus>) {
  const shownFor = ref(patientId.value)
  watch(status, (now) => {
    if (now !== 'pending') shownFor.value = patientId.value
  })
  return computed(() => shownFor.value !== patientId.value)
}
