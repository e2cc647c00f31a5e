import { z } from 'zod'
import { FATIGUE_LEVELS, HOT_FLUSH_INTERFERENCE, HOT_FLUSH_SEVERITIES } from './scores'
import { PAIN_LOCATIONS, RIGHT_NOW_ITEMS } from '../triage/rules'
import { safeText } from '../common/text'

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

/** Sane ranges for a thermometer reading, per unit (34-43 °C). */
export const TEMPERATURE_RANGES = {
  '°C': { min: 34, max: 43 },
  '°F': { min: 93.2, max: 109.4 },
} as const

/** Constipation in the words of CTCAE v5.0's grades (none, 1 occasional, 2 persistent, 3 obstipation). */
export const CONSTIPATION_LEVELS = ['none', 'occasional', 'persistent', 'no-movement-despite-laxatives'] as const
export type ConstipationLevel = (typeof CONSTIPATION_LEVELS)[number]

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

const temperatureReading = z.discriminatedUnion('unit', [
  section({
    unit: z.literal('°C'),
    value: z.number({ required_error: message('required'), invalid_type_error: message('temperatureCRange') })
      .min(TEMPERATURE_RANGES['°C'].min, message('temperatureCRange'))
      .max(TEMPERATURE_RANGES['°C'].max, message('temperatureCRange')),
  }),
  section({
    unit: z.literal('°F'),
    value: z.number({ required_error: message('required'), invalid_type_error: message('temperatureFRange') })
      .min(TEMPERATURE_RANGES['°F'].min, message('temperatureFRange'))
      .max(TEMPERATURE_RANGES['°F'].max, message('temperatureFRange')),
  }),
], { errorMap: () => ({ message: message('temperatureUnit') }) })

/*
 * Areas added in rules version 3 (infection, bowel, falls, allergy, mind, headache): one
 * screening question each (`any`), the details only after a yes. The page clears the
 * details when the screening answer goes back to no; triage reads the details whatever
 * the screening answer says, so a detail can never be hidden by it.
 */
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
    /** One calf or leg newly painful, swollen, warm or red (a possible blood clot). */
    oneLegPainfulSwollen: yesNo,
  }),
  sugar: section({
    veryThirsty: yesNo,
    urinatingMore: yesNo,
    blurredVision: yesNo,
    /** Shaky, sweaty, hungry, pounding heart or muddled: signs of low blood sugar. */
    lowSugarSigns: yesNo,
    /** A low blood sugar he could not treat himself, someone had to help (ADA level 3). */
    neededHelpForLowSugar: yesNo,
    glucose: glucoseReading.optional(),
  }),
  infection: section({
    /** Screening: a fever, chills or feeling hot and shivery this week. */
    any: yesNo,
    temperature: temperatureReading.optional(),
    shakingChills: yesNo,
    /** Feels generally unwell with it (NICE CG151 treats "feeling unwell" like a fever during chemotherapy). */
    feelsUnwell: yesNo,
  }),
  bowel: section({
    /** Screening: any change in his bowels this week. */
    any: yesNo,
    /** Stools a day more than usual for him (CTCAE v5.0 diarrhoea grades count the increase). */
    extraStoolsPerDay: wholeNumber(0, 30, 'extraStoolsRange'),
    constipation: choice(CONSTIPATION_LEVELS),
    bloodOrBlackStool: yesNo,
    /** Vomiting, or cannot keep fluids down. */
    vomiting: yesNo,
  }),
  falls: section({
    /** Screening: a fall this week. */
    any: yesNo,
    hitHeadOrHurt: yesNo,
    /** Cannot put weight on a leg, or a new pain or shape in a bone since the fall. */
    cannotBearWeight: yesNo,
  }),
  allergy: section({
    /** Screening: a rash, itching or hives since the last injection. */
    any: yesNo,
    /** Spreading over the body, or with swollen lips or eyes (throat swelling is a right-now item). */
    spreading: yesNo,
  }),
  mind: section({
    /** Screening: new muddled thinking or unusual drowsiness, noticed by him or by those around him. */
    any: yesNo,
    confusedOrHardToWake: yesNo,
    memoryOrConcentration: yesNo,
  }),
  headache: section({
    /** Screening: a headache that is new or unusual for him. */
    any: yesNo,
    suddenSevere: yesNo,
    /** With a change in sight (double or lost vision) or with vomiting. */
    visionOrVomiting: yesNo,
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
  note: safeText({ multiLine: true, invalid_type_error: message('noteText') })
    .max(NOTE_MAX_LENGTH, message('noteTooLong'))
    .optional(),
})

export type DiaryEntryInput = z.infer<typeof diaryEntrySchema>

/**
 * What the diary page sends: the whole entry, with the id the page gave its draft. The same
 * draft id joins an entry already opened by a right-now "yes" sent on its own, and makes a
 * second send of the same draft (a double click, a retry) return the entry already stored.
 */
export const draftIdSchema = z.string({ required_error: message('required'), invalid_type_error: message('draftId') })
  .uuid(message('draftId'))

export const diarySubmissionSchema = diaryEntrySchema.extend({ draftId: draftIdSchema.optional() })
export type DiarySubmission = z.infer<typeof diarySubmissionSchema>

/**
 * A right-now "yes" sent on its own the moment it is answered, before the rest of the
 * diary: the right-now items answered yes so far (a yes once sent stays in the entry).
 */
export const rightNowReportSchema = z.object({
  draftId: draftIdSchema,
  items: z.array(z.enum(RIGHT_NOW_ITEMS, { errorMap: () => ({ message: message('choice') }) }))
    .min(1, message('required'))
    .refine(items => new Set(items).size === items.length, message('choice')),
}).strict(message('unknownField'))
export type RightNowReport = z.infer<typeof rightNowReportSchema>

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
    heart: { fainting: false, racingOrIrregular: false, legSwelling: false, breathlessLightEffort: false, oneLegPainfulSwollen: false },
    sugar: { veryThirsty: false, urinatingMore: false, blurredVision: false, lowSugarSigns: false, neededHelpForLowSugar: false },
    infection: { any: false, shakingChills: false, feelsUnwell: false },
    bowel: { any: false, extraStoolsPerDay: 0, constipation: 'none', bloodOrBlackStool: false, vomiting: false },
    falls: { any: false, hitHeadOrHurt: false, cannotBearWeight: false },
    allergy: { any: false, spreading: false },
    mind: { any: false, confusedOrHardToWake: false, memoryOrConcentration: false },
    headache: { any: false, suddenSevere: false, visionOrVomiting: false },
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

/**
 * An entry stored by an older diary laid over a fresh one, so the areas it did not ask yet
 * read as "no" (for views and baselines; the stored answers are never rewritten).
 */
export function withDiaryDefaults(answers: unknown): DiaryEntryInput {
  const fresh = emptyDiaryEntry() as unknown as Record<string, unknown>
  if (!answers || typeof answers !== 'object') return fresh as unknown as DiaryEntryInput
  const stored = answers as Record<string, unknown>
  const result: Record<string, unknown> = { ...fresh }
  for (const [key, value] of Object.entries(stored)) {
    const base = fresh[key]
    result[key] = base && typeof base === 'object' && !Array.isArray(base) && value && typeof value === 'object' && !Array.isArray(value)
      ? { ...(base as object), ...(value as object) }
      : value
  }
  return result as unknown as DiaryEntryInput
}
