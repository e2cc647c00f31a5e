import type { VisitView } from '#shared/visit/views'

/** The fetch key of one visit's page. */
export const visitKey = (visitId: number) => `visit-${visitId}`

/** What every step's form card shares: its heading id, its words (visit.<step>), an h3, inset under the step. */
export const visitCard = (step: string, texts = `visit.${step}`) => ({ headingId: `visit-${step}-form-heading`, texts, headingTag: 'h3' as const, inset: true })

/**
 * The visit's steps as the page sends them: each posts to its route under the visit and the
 * page reads the visit again, so every step shows what the server recorded. `yesNo` is the
 * options of a yes/no question (FormChoices), in the reader's language.
 */
export function useVisitSteps(visit: () => VisitView) {
  const { t } = useI18n()
  async function post(step: string, body: object) {
    const { id, patient } = visit()
    await $fetch(`/api/patients/${patient.id}/visits/${id}/${step}`, { method: 'POST', body })
    await refreshNuxtData([visitKey(id), `schedule-${patient.id}`])
  }
  const yesNo = (yes: string, no: string) => [{ value: true, label: t(yes) }, { value: false, label: t(no) }]
  return { post, yesNo }
}
