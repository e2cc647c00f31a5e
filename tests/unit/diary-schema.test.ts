import { describe, expect, it } from 'vitest'
import en from '../../locales/en.json'
import es from '../../locales/es.json'
import { NOTE_MAX_LENGTH, diaryEntrySchema, emptyDiaryEntry } from '#shared/diary/schemas'
import type { DiaryEntryInput } from '#shared/diary/schemas'
import { RIGHT_NOW_ITEMS } from '#shared/triage/rules'

type Change = (entry: Record<string, unknown> & DiaryEntryInput) => void

function answers(...changes: Change[]): unknown {
  const entry = emptyDiaryEntry() as Record<string, unknown> & DiaryEntryInput
  for (const change of changes) change(entry)
  return entry
}

function issuesOf(input: unknown) {
  const result = diaryEntrySchema.safeParse(input)
  return result.success ? [] : result.error.issues.map(issue => ({ path: issue.path.join('.'), message: issue.message }))
}

const lookup = (root: unknown, key: string): unknown =>
  key.split('.').reduce<unknown>((node, part) => (node && typeof node === 'object' ? (node as Record<string, unknown>)[part] : undefined), root)

const fullEntry: DiaryEntryInput = {
  ...emptyDiaryEntry(),
  hotFlushes: { perDay: 6, worstSeverity: 'moderate', interference: 'usual-activities' },
  pain: {
    worst: 5,
    locations: ['back', 'hips'],
    newOrWorse: true,
    wakesAtNight: false,
    worseOnStraining: true,
    bandLike: false,
    tinglingOrNumbness: false,
  },
  urinary: { weakStreamOrStraining: true, blood: false, burning: false, ipss: { items: [1, 2, 0, 1, 3, 0, 2], qualityOfLife: 3 } },
  sugar: { veryThirsty: true, urinatingMore: false, blurredVision: false, lowSugarSigns: false, neededHelpForLowSugar: false, glucose: { value: 8.4, unit: 'mmol/L' } },
  mood: { phq2Interest: 1, phq2Down: 2 },
  fatigue: 'eased-by-rest',
  note: 'Slept badly on Tuesday. <b>not bold</b>',
}

describe('diaryEntrySchema accepts a good entry', () => {
  it('an entry with every answer no or zero', () => {
    expect(diaryEntrySchema.parse(emptyDiaryEntry())).toEqual(emptyDiaryEntry())
  })

  it('a full entry with the IPSS, a glucose reading and a note, unchanged', () => {
    expect(diaryEntrySchema.parse(fullEntry)).toEqual(fullEntry)
  })

  it('keeps the note as the text he wrote (shown as text, never as HTML)', () => {
    expect(diaryEntrySchema.parse(fullEntry).note).toBe('Slept badly on Tuesday. <b>not bold</b>')
  })

  it('the right-now check asks exactly the triage items', () => {
    expect(Object.keys(diaryEntrySchema.shape.rightNow.shape).sort()).toEqual([...RIGHT_NOW_ITEMS].sort())
  })

  it.each([
    ['a note of exactly 2,000 characters', (e: DiaryEntryInput) => (e.note = 'a'.repeat(2000))],
    ['50 hot flushes a day', (e: DiaryEntryInput) => (e.hotFlushes.perDay = 50)],
    ['pain 10', (e: DiaryEntryInput) => (e.pain.worst = 10)],
    ['glucose 20 mg/dL', (e: DiaryEntryInput) => (e.sugar.glucose = { value: 20, unit: 'mg/dL' })],
    ['glucose 600 mg/dL', (e: DiaryEntryInput) => (e.sugar.glucose = { value: 600, unit: 'mg/dL' })],
    ['glucose 1.1 mmol/L', (e: DiaryEntryInput) => (e.sugar.glucose = { value: 1.1, unit: 'mmol/L' })],
    ['glucose 33.3 mmol/L', (e: DiaryEntryInput) => (e.sugar.glucose = { value: 33.3, unit: 'mmol/L' })],
    ['IPSS all 5 and quality of life 6', (e: DiaryEntryInput) => (e.urinary.ipss = { items: [5, 5, 5, 5, 5, 5, 5], qualityOfLife: 6 })],
    ['PHQ-2 items of 3', (e: DiaryEntryInput) => (e.mood = { phq2Interest: 3, phq2Down: 3 })],
  ])('the edge value: %s', (_label, change) => {
    expect(issuesOf(answers(change))).toEqual([])
  })
})

/** Bad input, the field it is reported at and the locale key of the message. */
const BAD_INPUT: [string, Change, string, string][] = [
  ['an unknown field at the top', e => (e.extra = true), '', 'validation.diary.unknownField'],
  ['an unknown field inside a section', e => ((e.pain as Record<string, unknown>).shape = 'sharp'), 'pain', 'validation.diary.unknownField'],
  ['an unknown field inside the IPSS', e => (e.urinary.ipss = { items: [0, 0, 0, 0, 0, 0, 0], qualityOfLife: 0, total: 0 } as DiaryEntryInput['urinary']['ipss']), 'urinary.ipss', 'validation.diary.unknownField'],
  ['a note of 2,001 characters', e => (e.note = 'a'.repeat(NOTE_MAX_LENGTH + 1)), 'note', 'validation.diary.noteTooLong'],
  ['a note of 3,000 characters', e => (e.note = 'a'.repeat(3000)), 'note', 'validation.diary.noteTooLong'],
  ['a note that is not text', e => ((e as Record<string, unknown>).note = 42), 'note', 'validation.diary.noteText'],
  ['pain 11', e => (e.pain.worst = 11), 'pain.worst', 'validation.diary.painRange'],
  ['pain -1', e => (e.pain.worst = -1), 'pain.worst', 'validation.diary.painRange'],
  ['pain 4.5', e => (e.pain.worst = 4.5), 'pain.worst', 'validation.diary.painRange'],
  ['pain as text', e => ((e.pain as Record<string, unknown>).worst = '7'), 'pain.worst', 'validation.diary.painRange'],
  ['51 hot flushes a day', e => (e.hotFlushes.perDay = 51), 'hotFlushes.perDay', 'validation.diary.hotFlushesPerDayRange'],
  ['an unknown severity', e => ((e.hotFlushes as Record<string, unknown>).worstSeverity = 'extreme'), 'hotFlushes.worstSeverity', 'validation.diary.choice'],
  ['an unknown fatigue answer', e => ((e as Record<string, unknown>).fatigue = 'very'), 'fatigue', 'validation.diary.choice'],
  ['an unknown pain location', e => ((e.pain as Record<string, unknown>).locations = ['back', 'toe']), 'pain.locations.1', 'validation.diary.choice'],
  ['a pain location twice', e => (e.pain.locations = ['back', 'back']), 'pain.locations', 'validation.diary.locationsRepeated'],
  ['six IPSS items', e => (e.urinary.ipss = { items: [1, 1, 1, 1, 1, 1], qualityOfLife: 2 }), 'urinary.ipss.items', 'validation.diary.ipssItems'],
  ['an IPSS item of 6', e => (e.urinary.ipss = { items: [1, 1, 1, 1, 1, 1, 6], qualityOfLife: 2 }), 'urinary.ipss.items.6', 'validation.diary.ipssItemRange'],
  ['an IPSS quality of life of 7', e => (e.urinary.ipss = { items: [1, 1, 1, 1, 1, 1, 1], qualityOfLife: 7 }), 'urinary.ipss.qualityOfLife', 'validation.diary.ipssQualityOfLifeRange'],
  ['glucose 19 mg/dL', e => (e.sugar.glucose = { value: 19, unit: 'mg/dL' }), 'sugar.glucose.value', 'validation.diary.glucoseMgDlRange'],
  ['glucose 601 mg/dL', e => (e.sugar.glucose = { value: 601, unit: 'mg/dL' }), 'sugar.glucose.value', 'validation.diary.glucoseMgDlRange'],
  ['glucose 120.5 mg/dL', e => (e.sugar.glucose = { value: 120.5, unit: 'mg/dL' }), 'sugar.glucose.value', 'validation.diary.glucoseMgDlRange'],
  ['glucose 1.0 mmol/L', e => (e.sugar.glucose = { value: 1.0, unit: 'mmol/L' }), 'sugar.glucose.value', 'validation.diary.glucoseMmolLRange'],
  ['glucose 33.4 mmol/L', e => (e.sugar.glucose = { value: 33.4, unit: 'mmol/L' }), 'sugar.glucose.value', 'validation.diary.glucoseMmolLRange'],
  ['glucose 300 in mmol/L (a reading meant as mg/dL)', e => (e.sugar.glucose = { value: 300, unit: 'mmol/L' }), 'sugar.glucose.value', 'validation.diary.glucoseMmolLRange'],
  ['an unknown glucose unit', e => ((e.sugar as Record<string, unknown>).glucose = { value: 120, unit: 'mg' }), 'sugar.glucose.unit', 'validation.diary.glucoseUnit'],
  ['a PHQ-2 item of 4', e => (e.mood.phq2Down = 4), 'mood.phq2Down', 'validation.diary.phq2Range'],
  ['yes written as text', e => ((e.rightNow as Record<string, unknown>).chestPain = 'yes'), 'rightNow.chestPain', 'validation.diary.yesNo'],
  ['a missing answer', e => delete (e.heart as Record<string, unknown>).fainting, 'heart.fainting', 'validation.diary.required'],
  ['a missing section', e => delete (e as Record<string, unknown>).mood, 'mood', 'validation.diary.required'],
  ['a section that is not an object', e => ((e as Record<string, unknown>).heart = true), 'heart', 'validation.diary.section'],
]

describe('diaryEntrySchema refuses bad input with a locale key at the field', () => {
  it.each(BAD_INPUT)('%s', (_label, change, path, message) => {
    expect(issuesOf(answers(change))).toContainEqual({ path, message })
  })

  it('refuses something that is not an entry at all', () => {
    expect(issuesOf('hello')).toEqual([{ path: '', message: 'validation.diary.section' }])
    expect(issuesOf(null)).toEqual([{ path: '', message: 'validation.diary.section' }])
  })

  it('every message has English and Spanish text', () => {
    const messages = new Set(BAD_INPUT.map(([, , , message]) => message))
    for (const message of messages) {
      expect(typeof lookup(en, message), `en ${message}`).toBe('string')
      expect(typeof lookup(es, message), `es ${message}`).toBe('string')
    }
  })
})
