/**
 * The weekly diary's steps in order, with the top-level answers each one asks. The review
 * step asks nothing; it shows every answer with a way back to its step. The areas added in
 * rules version 3 (infection, bowel, falls, allergy, mind, headache) share one step: a
 * screening question each, the details only after a yes.
 */
export const DIARY_STEPS = [
  { id: 'rightNow', sections: ['rightNow'] },
  { id: 'hotFlushes', sections: ['hotFlushes'] },
  { id: 'pain', sections: ['pain'] },
  { id: 'urinary', sections: ['urinary'] },
  { id: 'heart', sections: ['heart'] },
  { id: 'sugar', sections: ['sugar'] },
  { id: 'otherChanges', sections: ['infection', 'bowel', 'falls', 'allergy', 'mind', 'headache'] },
  { id: 'moodFatigue', sections: ['mood', 'fatigue'] },
  { id: 'injectionSite', sections: ['injectionSite'] },
  { id: 'note', sections: ['note'] },
  { id: 'review', sections: [] },
] as const satisfies readonly { id: string, sections: readonly string[] }[]

export type DiaryStepId = (typeof DIARY_STEPS)[number]['id']

export const REVIEW_STEP = DIARY_STEPS.length - 1

/** The step that asks the answer at a form path such as "urinary.ipss.items[2]"; -1 if none. */
export function diaryStepOfPath(path: string): number {
  const section = path.split(/[.[]/)[0] ?? ''
  return DIARY_STEPS.findIndex(step => (step.sections as readonly string[]).includes(section))
}

/** The steps with their titles in the current language. */
export function useDiarySteps() {
  const { t } = useI18n()
  return computed(() => DIARY_STEPS.map((step, index) => ({ ...step, index, title: t(`diary.steps.${step.id}`) })))
}

/** An instant (the right-now report's delivery) as a time of day in the clinic's zone; '' when there is none. */
export function useDiarySentTime(sentAt: () => string | null) {
  const { d } = useI18n()
  const { data: clinic } = useClinic()
  return computed(() => {
    const iso = sentAt()
    return iso ? d(new Date(iso), { key: 'time', timeZone: clinic.value.timeZone }) : ''
  })
}
