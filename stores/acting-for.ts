import { defineStore } from 'pinia'

/**
 * Whose record a caregiver has open. Kept in a cookie so the server renders the same
 * record; the server still checks the grant on every request.
 */
export const useActingForStore = defineStore('acting-for', () => {
  const cookie = useCookie<number | null>('tw_acting_for', { sameSite: 'lax', default: () => null })
  const selectedPatientId = computed(() => cookie.value)
  function select(patientId: number) {
    cookie.value = patientId
  }
  function clear() {
    cookie.value = null
  }
  return { selectedPatientId, select, clear }
})
