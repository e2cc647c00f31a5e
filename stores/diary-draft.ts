import { defineStore } from 'pinia'
import { emptyDiaryEntry } from '~~/shared/schemas/diary'
import type { DiaryEntryInput } from '~~/shared/schemas/diary'

/** The IPSS part of a draft: an item stays null until he picks an answer. */
export interface IpssDraft {
  items: (number | null)[]
  qualityOfLife: number | null
}

/**
 * A diary entry on its way: numbers he has typed may not be numbers yet and IPSS answers
 * may be missing; the shared schema says what is wrong at the field before it is sent.
 */
export type DiaryDraft = Omit<DiaryEntryInput, 'urinary'> & {
  urinary: Omit<DiaryEntryInput['urinary'], 'ipss'> & { ipss?: IpssDraft }
}

export type GlucoseUnit = 'mg/dL' | 'mmol/L'

interface SavedDraft {
  version: 1
  draft: DiaryDraft
  step: number
  glucoseUnit: GlucoseUnit
  rightNowAcknowledged: boolean
  ipssDecided: boolean
}

const STORAGE_PREFIX = 'tidewell:diary-draft:'

export const IPSS_ITEM_COUNT = 7

export function emptyIpss(): IpssDraft {
  return { items: Array.from({ length: IPSS_ITEM_COUNT }, () => null), qualityOfLife: null }
}

function isObject(value: unknown): value is Record<string, unknown> {
  return value !== null && typeof value === 'object' && !Array.isArray(value)
}

/** Lays a saved draft over a fresh one, so a draft saved by an older page never lacks a section. */
function restore(saved: unknown): DiaryDraft {
  const fresh = emptyDiaryEntry() as DiaryDraft
  if (!isObject(saved)) return fresh
  const result: Record<string, unknown> = { ...fresh }
  for (const [key, value] of Object.entries(fresh)) {
    const stored = saved[key]
    if (stored === undefined) continue
    result[key] = isObject(value) && isObject(stored) ? { ...value, ...stored } : stored
  }
  if (typeof saved.note === 'string') result.note = saved.note
  return result as DiaryDraft
}

/**
 * The weekly diary he is filling in and the step he is on. Kept in localStorage per patient
 * (a caregiver helping two people keeps two drafts), read only after the page has mounted
 * so the server-rendered page and the first client render agree.
 */
export const useDiaryDraftStore = defineStore('diary-draft', () => {
  const patientId = ref<number | null>(null)
  const draft = ref<DiaryDraft>(emptyDiaryEntry() as DiaryDraft)
  const step = ref(0)
  const glucoseUnit = ref<GlucoseUnit>('mg/dL')
  /** He has seen the emergency instructions and chose to go on with the diary. */
  const rightNowAcknowledged = ref(false)
  /** The monthly IPSS questions were opened for him, or he chose to leave them this time. */
  const ipssDecided = ref(false)
  const hydrated = ref(false)

  const storageKey = (id: number) => `${STORAGE_PREFIX}${id}`

  function reset() {
    draft.value = emptyDiaryEntry() as DiaryDraft
    step.value = 0
    glucoseUnit.value = 'mg/dL'
    rightNowAcknowledged.value = false
    ipssDecided.value = false
  }

  /** Reads the saved draft for this patient; call from onMounted. */
  function hydrate(id: number) {
    if (hydrated.value && patientId.value === id) return
    patientId.value = id
    reset()
    try {
      const raw = window.localStorage.getItem(storageKey(id))
      const saved = raw ? JSON.parse(raw) as Partial<SavedDraft> : null
      if (saved?.version === 1) {
        draft.value = restore(saved.draft)
        step.value = Number.isInteger(saved.step) ? Number(saved.step) : 0
        glucoseUnit.value = saved.glucoseUnit === 'mmol/L' ? 'mmol/L' : 'mg/dL'
        rightNowAcknowledged.value = saved.rightNowAcknowledged === true
        ipssDecided.value = saved.ipssDecided === true
      }
    }
    catch {
      // A draft that cannot be read (private mode, a damaged value) starts afresh.
    }
    hydrated.value = true
  }

  function save() {
    if (!import.meta.client || !hydrated.value || patientId.value === null) return
    const saved: SavedDraft = {
      version: 1,
      draft: draft.value,
      step: step.value,
      glucoseUnit: glucoseUnit.value,
      rightNowAcknowledged: rightNowAcknowledged.value,
      ipssDecided: ipssDecided.value,
    }
    try {
      window.localStorage.setItem(storageKey(patientId.value), JSON.stringify(saved))
    }
    catch {
      // Storage full or blocked: the draft still lives in this tab.
    }
  }

  watch([draft, step, glucoseUnit, rightNowAcknowledged, ipssDecided], save, { deep: true })

  function openIpss() {
    draft.value.urinary.ipss ??= emptyIpss()
    ipssDecided.value = true
  }

  function closeIpss() {
    delete draft.value.urinary.ipss
    ipssDecided.value = true
  }

  /** After a successful submit: forget the draft for this patient. */
  function clear() {
    if (import.meta.client && patientId.value !== null) {
      try {
        window.localStorage.removeItem(storageKey(patientId.value))
      }
      catch {
        // Nothing to remove.
      }
    }
    hydrated.value = false
    reset()
  }

  return {
    patientId,
    draft,
    step,
    glucoseUnit,
    rightNowAcknowledged,
    ipssDecided,
    hydrated,
    hydrate,
    openIpss,
    closeIpss,
    clear,
  }
})
