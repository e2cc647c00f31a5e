import type { InjectionKey } from 'vue'
import { diaryEntrySchema } from '#shared/diary/schemas'

/**
 * The weekly diary's steps in order, with the top-level answers each one asks, and whether
 * the step opens with an intro under its heading (`diary.<id>.intro`). The review
 * step asks nothing; it shows every answer with a way back to its step. The areas added in
 * rules version 3 (infection, bowel, falls, allergy, mind, headache) share one step: a
 * screening question each, the details only after a yes.
 */
export const DIARY_STEPS = [
  { id: 'rightNow', sections: ['rightNow'], intro: true },
  { id: 'hotFlushes', sections: ['hotFlushes'], intro: true },
  { id: 'pain', sections: ['pain'] },
  { id: 'urinary', sections: ['urinary'] },
  { id: 'heart', sections: ['heart'] },
  { id: 'sugar', sections: ['sugar'] },
  { id: 'otherChanges', sections: ['infection', 'bowel', 'falls', 'allergy', 'mind', 'headache'] },
  { id: 'moodFatigue', sections: ['mood', 'fatigue'] },
  { id: 'injectionSite', sections: ['injectionSite'], intro: true },
  { id: 'note', sections: ['note'] },
  { id: 'review', sections: [], intro: true },
] as const satisfies readonly { id: string, sections: readonly string[], intro?: true }[]

export type DiaryStepId = (typeof DIARY_STEPS)[number]['id']

export const REVIEW_STEP = DIARY_STEPS.length - 1

/** The step that asks the answer at a form path such as "urinary.ipss.items[2]"; -1 if none. */
export function diaryStepOfPath(path: string): number {
  const section = path.split(/[.[]/)[0] ?? ''
  return DIARY_STEPS.findIndex(step => (step.sections as readonly string[]).includes(section))
}

/** The steps with their titles and intros ('' for none) in the current language. */
export function useDiarySteps() {
  const { t } = useI18n()
  return computed(() => DIARY_STEPS.map((step, index) => ({
    ...step,
    index,
    title: t(`diary.steps.${step.id}`),
    intro: 'intro' in step ? t(`diary.${step.id}.intro`) : '',
  })))
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

/** The message at a form path ("bowel.extraStoolsPerDay"), for the questions of the step shown. */
type DiaryErrorAt = (path: string) => string | undefined
const DIARY_ERROR_AT: InjectionKey<DiaryErrorAt> = Symbol('diary error at')

/** Gives the questions below (the step shown) the messages of the diary check. */
export function provideDiaryErrors(errorAt: DiaryErrorAt) {
  provide(DIARY_ERROR_AT, errorAt)
}

/** The message at a form path; none outside a diary form. */
export function useDiaryError(): DiaryErrorAt {
  return inject(DIARY_ERROR_AT, () => undefined)
}

/** The id of the question asking the answer at a form path: "bowel.extraStoolsPerDay" is "diary-bowel-extraStoolsPerDay". */
export function diaryQuestionId(path: string) {
  return `diary-${path.replaceAll('.', '-')}`
}

/**
 * A question asked for the answer at a form path: its id (from the path, unless it names its
 * own) and the message at that path, or the one it is given.
 */
export function useDiaryQuestion(props: { path: string, id?: string, error?: string }) {
  const errorAt = useDiaryError()
  return {
    id: computed(() => props.id ?? diaryQuestionId(props.path)),
    error: computed(() => props.error ?? errorAt(props.path)),
  }
}

/** A question's answers worded from the locale: the label of each value is `${wording}.${value}`. */
export function useDiaryOptions<V extends string | number>(values: readonly V[], wording: string) {
  const { t } = useI18n()
  return computed(() => values.map(value => ({ value, label: t(`${wording}.${value}`) })))
}

/** Form paths as the step components ask for them: "urinary.ipss.items[2]". */
function pathOf(path: readonly PropertyKey[]): string {
  return path.reduce<string>((text, part) => typeof part === 'number' ? `${text}[${part}]` : text ? `${text}.${String(part)}` : String(part), '')
}

/**
 * The diary's answers checked where they live (the draft in the store) against the server's
 * own schema; the messages are locale keys by form path, shown at the field. There is no
 * second copy of the answers: what is checked and sent is a snapshot of the draft.
 */
export function useDiaryCheck() {
  const { t, te } = useI18n()
  const errors = ref<Record<string, string>>({})
  const errorText = (path: string) => {
    const key = errors.value[path]
    return key ? (te(key) ? t(key) : key) : undefined
  }
  /** Checks the whole draft; keeps the messages of the steps in `visible`, clears the rest. */
  function check(draft: object, visible: (step: number) => boolean) {
    const snapshot = structuredClone(toRaw(draft)) as Record<string, unknown> & { urinary: Record<string, unknown>, sugar: Record<string, unknown> }
    // An optional answer he took out (the note, IPSS, a reading) is not sent at all.
    if (snapshot.note === null) delete snapshot.note
    if (snapshot.urinary.ipss == null) delete snapshot.urinary.ipss
    if (snapshot.sugar.glucose == null) delete snapshot.sugar.glucose
    const result = diaryEntrySchema.safeParse(snapshot)
    const found: Record<string, string> = {}
    if (!result.success) {
      for (const issue of result.error.issues) {
        const path = pathOf(issue.path)
        if (!(path in found) && visible(diaryStepOfPath(path))) found[path] = issue.message
      }
    }
    errors.value = found
    return result.success ? { valid: true as const, values: result.data, paths: [] } : { valid: false as const, values: null, paths: result.error.issues.map(issue => pathOf(issue.path)) }
  }
  function setServerErrors(fields: Record<string, string>) {
    errors.value = { ...errors.value, ...fields }
  }
  const translated = computed(() => Object.fromEntries(Object.keys(errors.value).map(path => [path, errorText(path)])))
  return { errors, errorText, translated, check, setServerErrors }
}
