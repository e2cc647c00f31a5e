import { defineStore } from 'pinia'
import { RIGHT_NOW_ITEMS } from '#shared/triage/rules'
import type { RightNowItem } from '#shared/triage/rules'
import type { GlucoseUnit } from '#shared/labs/calculations'
import { emptyDiaryEntry, withDiaryDefaults } from '#shared/diary/schemas'
import type { DiaryEntryInput } from '#shared/diary/schemas'

/** The IPSS part of a draft: an item stays null until he picks an answer. */
export interface IpssDraft {
  items: (number | null)[]
  qualityOfLife: number | null
}

/** A right-now answer in a draft: null until he answers it (never "no" by default). */
export type RightNowDraft = Record<RightNowItem, boolean | null>

/**
 * A diary entry on its way: numbers he has typed may not be numbers yet, IPSS answers
 * and right-now answers may be missing; the shared schema says what is wrong at the field
 * before it is sent.
 */
export type DiaryDraft = Omit<DiaryEntryInput, 'urinary' | 'rightNow'> & {
  rightNow: RightNowDraft
  urinary: Omit<DiaryEntryInput['urinary'], 'ipss'> & { ipss?: IpssDraft }
}

export type TemperatureUnit = '°C' | '°F'

/** Where the right-now report stands: nothing to send, on its way, refused or unreachable, delivered. */
export type RightNowDelivery = 'idle' | 'sending' | 'failed' | 'delivered'

interface SavedDraft {
  version: 2
  draftId: string
  draft: DiaryDraft
  step: number
  glucoseUnit: GlucoseUnit
  temperatureUnit: TemperatureUnit
  ipssDecided: boolean
  /** Right-now items the server has confirmed, and when. */
  rightNowSent: RightNowItem[]
  rightNowSentAt: string | null
}

const STORAGE_PREFIX = 'tidewell:diary-draft:'

export const IPSS_ITEM_COUNT = 7

/** Waits between tries of an undelivered right-now report: quick at first, then every 30 s. */
export const RIGHT_NOW_RETRY_MS = [2_000, 5_000, 10_000, 20_000, 30_000] as const

export function emptyIpss(): IpssDraft {
  return { items: Array.from({ length: IPSS_ITEM_COUNT }, () => null), qualityOfLife: null }
}

export function unansweredRightNow(): RightNowDraft {
  return Object.fromEntries(RIGHT_NOW_ITEMS.map(item => [item, null])) as RightNowDraft
}

/** A fresh draft: every right-now question unanswered, every other answer "no", zero or none. */
export function emptyDiaryDraft(): DiaryDraft {
  return { ...(emptyDiaryEntry() as unknown as DiaryDraft), rightNow: unansweredRightNow() }
}

function newDraftId(): string {
  return globalThis.crypto.randomUUID()
}

function isObject(value: unknown): value is Record<string, unknown> {
  return value !== null && typeof value === 'object' && !Array.isArray(value)
}

/**
 * Lays a saved draft over a fresh one (withDiaryDefaults), so a draft saved by an older page
 * never lacks a section; keys the diary no longer has are dropped (the server's schema is
 * strict), and a right-now question not answered yes or no stays unanswered.
 */
export function restoreDiaryDraft(saved: unknown): DiaryDraft {
  if (!isObject(saved)) return emptyDiaryDraft()
  const fresh = emptyDiaryDraft() as unknown as Record<string, unknown>
  const known = Object.fromEntries(Object.entries(saved).filter(([key, value]) => key === 'note' ? typeof value === 'string' : key in fresh))
  const result = withDiaryDefaults(known) as unknown as DiaryDraft
  const rightNow = isObject(saved.rightNow) ? saved.rightNow : {}
  result.rightNow = Object.fromEntries(RIGHT_NOW_ITEMS.map(item => [item, typeof rightNow[item] === 'boolean' ? rightNow[item] : null])) as RightNowDraft
  return result
}

/** The right-now items answered yes in a draft. */
export function rightNowYes(rightNow: RightNowDraft): RightNowItem[] {
  return RIGHT_NOW_ITEMS.filter(item => rightNow[item] === true)
}

/**
 * The weekly diary he is filling in and the step he is on. Kept in localStorage per patient
 * (a caregiver helping two people keeps two drafts), read only after the page has mounted
 * so the server-rendered page and the first client render agree.
 *
 * A right-now "yes" does not wait for the end of the diary: `reportRightNow` sends it at
 * once under the draft's id, and keeps trying (growing waits, and when the browser comes
 * back online) until the server has it. What was delivered is saved with the draft, and
 * what is answered yes but not delivered is sent again after a reload.
 */
export const useDiaryDraftStore = defineStore('diary-draft', () => {
  const patientId = ref<number | null>(null)
  const draftId = ref('')
  const draft = ref<DiaryDraft>(emptyDiaryDraft())
  const step = ref(0)
  const glucoseUnit = ref<GlucoseUnit>('mg/dL')
  const temperatureUnit = ref<TemperatureUnit>('°F')
  /** The monthly IPSS questions were opened for him, or he chose to leave them this time. */
  const ipssDecided = ref(false)
  const hydrated = ref(false)

  const rightNowSent = ref<RightNowItem[]>([])
  const rightNowSentAt = ref<string | null>(null)
  const delivery = ref<RightNowDelivery>('idle')
  /** Failed tries in a row, for the wait before the next one. */
  const failures = ref(0)
  let inFlight = false
  let retryTimer: ReturnType<typeof setTimeout> | null = null

  /** Answered yes but not yet confirmed by the server. */
  const rightNowPending = computed(() => rightNowYes(draft.value.rightNow).filter(item => !rightNowSent.value.includes(item)))

  const storageKey = (id: number) => `${STORAGE_PREFIX}${id}`

  function stopRetrying() {
    if (retryTimer !== null) clearTimeout(retryTimer)
    retryTimer = null
  }

  function reset() {
    stopRetrying()
    draftId.value = newDraftId()
    draft.value = emptyDiaryDraft()
    step.value = 0
    glucoseUnit.value = 'mg/dL'
    temperatureUnit.value = '°F'
    ipssDecided.value = false
    rightNowSent.value = []
    rightNowSentAt.value = null
    delivery.value = 'idle'
    failures.value = 0
  }

  /** Reads the saved draft for this patient; call from onMounted. */
  function hydrate(id: number) {
    if (hydrated.value && patientId.value === id) return
    patientId.value = id
    reset()
    try {
      const raw = window.localStorage.getItem(storageKey(id))
      const saved = raw ? JSON.parse(raw) as Partial<Omit<SavedDraft, 'version'>> & { version?: number } : null
      if (saved?.version === 2 && typeof saved.draftId === 'string' && saved.draftId) {
        draftId.value = saved.draftId
        draft.value = restoreDiaryDraft(saved.draft)
        step.value = Number.isInteger(saved.step) ? Number(saved.step) : 0
        glucoseUnit.value = saved.glucoseUnit === 'mmol/L' ? 'mmol/L' : 'mg/dL'
        temperatureUnit.value = saved.temperatureUnit === '°C' ? '°C' : '°F'
        ipssDecided.value = saved.ipssDecided === true
        rightNowSent.value = Array.isArray(saved.rightNowSent) ? RIGHT_NOW_ITEMS.filter(item => saved.rightNowSent!.includes(item)) : []
        rightNowSentAt.value = typeof saved.rightNowSentAt === 'string' ? saved.rightNowSentAt : null
        // A yes once sent stays a yes in the draft.
        for (const item of rightNowSent.value) draft.value.rightNow[item] = true
        if (rightNowSent.value.length) delivery.value = 'delivered'
      }
      else if (saved?.version === 1) {
        // A draft from the page before right-now answers started unanswered: keep the rest,
        // ask the right-now check again.
        draft.value = { ...restoreDiaryDraft(saved.draft), rightNow: unansweredRightNow() }
        glucoseUnit.value = saved.glucoseUnit === 'mmol/L' ? 'mmol/L' : 'mg/dL'
        ipssDecided.value = saved.ipssDecided === true
      }
    }
    catch {
      // A draft that cannot be read (private mode, a damaged value) starts afresh.
    }
    hydrated.value = true
    if (rightNowPending.value.length) reportRightNow()
  }

  function save() {
    if (!import.meta.client || !hydrated.value || patientId.value === null) return
    const saved: SavedDraft = {
      version: 2,
      draftId: draftId.value,
      draft: draft.value,
      step: step.value,
      glucoseUnit: glucoseUnit.value,
      temperatureUnit: temperatureUnit.value,
      ipssDecided: ipssDecided.value,
      rightNowSent: rightNowSent.value,
      rightNowSentAt: rightNowSentAt.value,
    }
    try {
      window.localStorage.setItem(storageKey(patientId.value), JSON.stringify(saved))
    }
    catch {
      // Storage full or blocked: the draft still lives in this tab.
    }
  }

  watch([draft, step, glucoseUnit, temperatureUnit, ipssDecided, rightNowSent, rightNowSentAt], save, { deep: true })

  function scheduleRetry() {
    stopRetrying()
    const wait = RIGHT_NOW_RETRY_MS[Math.min(failures.value - 1, RIGHT_NOW_RETRY_MS.length - 1)]!
    retryTimer = setTimeout(() => {
      retryTimer = null
      reportRightNow()
    }, wait)
  }

  /**
   * Sends every right-now item answered yes so far (the server adds them to the entry of
   * this draft and alerts the nurses once). One try at a time; a yes answered during a try
   * goes in the next one.
   */
  async function reportRightNow() {
    if (!import.meta.client || patientId.value === null || inFlight) return
    const items = rightNowYes(draft.value.rightNow)
    if (!items.some(item => !rightNowSent.value.includes(item))) return
    stopRetrying()
    inFlight = true
    delivery.value = 'sending'
    const forPatient = patientId.value
    const forDraft = draftId.value
    try {
      await $fetch(`/api/patients/${forPatient}/diary/right-now`, { method: 'POST', body: { draftId: forDraft, items } })
      if (forPatient !== patientId.value || forDraft !== draftId.value) return
      rightNowSent.value = RIGHT_NOW_ITEMS.filter(item => items.includes(item) || rightNowSent.value.includes(item))
      rightNowSentAt.value = new Date().toISOString()
      failures.value = 0
      delivery.value = 'delivered'
    }
    catch {
      if (forPatient !== patientId.value || forDraft !== draftId.value) return
      failures.value += 1
      delivery.value = 'failed'
    }
    finally {
      inFlight = false
    }
    if (rightNowPending.value.length) {
      if (delivery.value === 'failed') scheduleRetry()
      else reportRightNow()
    }
  }

  if (import.meta.client) {
    // Back online: try at once instead of waiting for the next retry.
    window.addEventListener('online', () => {
      if (rightNowPending.value.length) reportRightNow()
    })
  }

  /** The whole entry reached the server: its right-now answers are delivered with it. */
  function markEntrySent() {
    stopRetrying()
    rightNowSent.value = rightNowYes(draft.value.rightNow)
  }

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
    draftId,
    draft,
    step,
    glucoseUnit,
    temperatureUnit,
    ipssDecided,
    hydrated,
    rightNowSent,
    rightNowSentAt,
    rightNowPending,
    delivery,
    failures,
    hydrate,
    reportRightNow,
    markEntrySent,
    openIpss,
    closeIpss,
    clear,
  }
})
