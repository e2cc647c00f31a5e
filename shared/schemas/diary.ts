import { z } from 'zod'
import { FATIGUE_LEVELS, HOT_FLUSH_INTERFERENCE, HOT_FLUSH_SEVERITIES } from '../clinical/scores'
import { PAIN_LOCATIONS } from '../clinical/triage'

/*
 * The weekly diary entry: one schema for the form (vee-validate through toTypedSchema)
 * and the server route (readValidatedBody). Every object is strict, so unknown fields are
 * refused. Error messages are locale keys under validation.diary; the client translates
 * them at the field.
 */

const message = (key: string) => `validation.diary.${key}`

const yesNo = z.boolean({ required_error: message('required'), invalid_type_error: message('yesNo') })

function wholeNumber(minimum: number, maximum: number, key: string) {
  return z.number({ required_error: message('required'), invalid_type_error: message(key) })
    .int(message(key))
    .min(minimum, message(key))
    .max(maximum, message(key))
}

function choice<T extends readonly [string, ...string[]]>(values: T) {
  return z.enum(values, { errorMap: () => ({ message: message('choice') }) })
}

function section<T extends z.ZodRawShape>(shape: T) {
  return z.object(shape, { required_error: message('required'), invalid_type_error: message('section') })
    .strict(message('unknownField'))
}

/** Sane ranges for a home glucose meter reading, per unit. */
export const GLUCOSE_RANGES = {
  'mg/dL': { min: 20, max: 600 },
  'mmol/L': { min: 1.1, max: 33.3 },
} as const

export const NOTE_MAX_LENGTH = 2000

const glucoseReading = z.discriminatedUnion('unit', [
  section({
    unit: z.literal('mg/dL'),
    value: wholeNumber(GLUCOSE_RANGES['mg/dL'].min, GLUCOSE_RANGES['mg/dL'].max, 'glucoseMgDlRange'),
  }),
  section({
    unit: z.literal('mmol/L'),
    value: z.number({ required_error: message('required'), invalid_type_error: message('glucoseMmolLRange') })
      .min(GLUCOSE_RANGES['mmol/L'].min, message('glucoseMmolLRange'))
      .max(GLUCOSE_RANGES['mmol/L'].max, message('glucoseMmolLRange')),
  }),
], { errorMap: () => ({ message: message('glucoseUnit') }) })

export const diaryEntrySchema = section({
  /** Right-now check: any "yes" is an emergency (see triage.ts). */
  rightNow: section({
    newWeakness: yesNo,
    newNumbness: yesNo,
    troubleWalking: yesNo,
    bladderBowelControl: yesNo,
    cannotPassUrine: yesNo,
    chestPain: yesNo,
    hardToBreathe: yesNo,
    faceDroopSpeech: yesNo,
    seizure: yesNo,
    faceThroatSwelling: yesNo,
    selfHarmThoughts: yesNo,
  }),
  hotFlushes: section({
    perDay: wholeNumber(0, 50, 'hotFlushesPerDayRange'),
    worstSeverity: choice(HOT_FLUSH_SEVERITIES),
    interference: choice(HOT_FLUSH_INTERFERENCE),
  }),
  pain: section({
    worst: wholeNumber(0, 10, 'painRange'),
    locations: z.array(choice(PAIN_LOCATIONS), { invalid_type_error: message('choice') })
      .refine(locations => new Set(locations).size === locations.length, message('locationsRepeated')),
    newOrWorse: yesNo,
    wakesAtNight: yesNo,
    worseOnStraining: yesNo,
    bandLike: yesNo,
    tinglingOrNumbness: yesNo,
  }),
  urinary: section({
    weakStreamOrStraining: yesNo,
    blood: yesNo,
    burning: yesNo,
    /** IPSS (Barry 1992), once a month or when the clinic asks. */
    ipss: section({
      items: z.array(wholeNumber(0, 5, 'ipssItemRange'), { invalid_type_error: message('ipssItems') })
        .length(7, message('ipssItems')),
      qualityOfLife: wholeNumber(0, 6, 'ipssQualityOfLifeRange'),
    }).optional(),
  }),
  heart: section({
    fainting: yesNo,
    racingOrIrregular: yesNo,
    legSwelling: yesNo,
    breathlessLightEffort: yesNo,
  }),
  sugar: section({
    veryThirsty: yesNo,
    urinatingMore: yesNo,
    blurredVision: yesNo,
    glucose: glucoseReading.optional(),
  }),
  mood: section({
    phq2Interest: wholeNumber(0, 3, 'phq2Range'),
    phq2Down: wholeNumber(0, 3, 'phq2Range'),
  }),
  fatigue: choice(FATIGUE_LEVELS),
  injectionSite: section({
    pain: yesNo,
    redness: yesNo,
    swelling: yesNo,
    lump: yesNo,
    feverOrSpreadingRednessOrPus: yesNo,
  }),
  /** Free text, stored and shown as text, never as HTML. */
  note: z.string({ invalid_type_error: message('noteText') })
    .max(NOTE_MAX_LENGTH, message('noteTooLong'))
    .optional(),
})

export type DiaryEntryInput = z.infer<typeof diaryEntrySchema>

/** A diary entry with every answer "no", zero or none: the start of a new draft. */
export function emptyDiaryEntry(): DiaryEntryInput {
  return {
    rightNow: {
      newWeakness: false,
      newNumbness: false,
      troubleWalking: false,
      bladderBowelControl: false,
      cannotPassUrine: false,
      chestPain: false,
      hardToBreathe: false,
      faceDroopSpeech: false,
      seizure: false,
      faceThroatSwelling: false,
      selfHarmThoughts: false,
    },
    hotFlushes: { perDay: 0, worstSeverity: 'none', interference: 'none' },
    pain: {
      worst: 0,
      locations: [],
      newOrWorse: false,
      wakesAtNight: false,
      worseOnStraining: false,
      bandLike: false,
      tinglingOrNumbness: false,
    },
    urinary: { weakStreamOrStraining: false, blood: false, burning: false },
    heart: { fainting: false, racingOrIrregular: false, legSwelling: false, breathlessLightEffort: false },
    sugar: { veryThirsty: false, urinatingMore: false, blurredVision: false },
    mood: { phq2Interest: 0, phq2Down: 0 },
    fatigue: 'none',
    injectionSite: { pain: false, redness: false, swelling: false, lump: false, feverOrSpreadingRednessOrPus: false },
  }
}

type DiaryChanges = { [K in keyof DiaryEntryInput]?: DiaryEntryInput[K] extends unknown[] ? DiaryEntryInput[K] : Partial<DiaryEntryInput[K]> | DiaryEntryInput[K] }

/** emptyDiaryEntry() with some sections changed (a section's other answers stay "no"). */
export function diaryEntryWith(changes: DiaryChanges): DiaryEntryInput {
  const entry = emptyDiaryEntry() as unknown as Record<string, unknown>
  for (const [key, value] of Object.entries(changes)) {
    entry[key] = value && typeof value === 'object' && !Array.isArray(value) ? { ...(entry[key] as object), ...value } : value
  }
  return entry as unknown as DiaryEntryInput
}
