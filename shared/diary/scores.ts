/*
 * Symptom scores for the weekly diary. Each function names its published source; where
 * the source gives no numbers for what we compute, the comment says the mapping is ours.
 */

import type { ConstipationLevel } from './schemas'

export type CtcaeGrade = 0 | 1 | 2 | 3

export const HOT_FLUSH_SEVERITIES = ['none', 'mild', 'moderate', 'severe', 'very-severe'] as const
export type HotFlushSeverity = (typeof HOT_FLUSH_SEVERITIES)[number]

/** How much hot flushes got in the way: not at all, usual activities, looking after himself. */
export const HOT_FLUSH_INTERFERENCE = ['none', 'usual-activities', 'self-care'] as const
export type HotFlushInterference = (typeof HOT_FLUSH_INTERFERENCE)[number]

/** Fatigue in the words of CTCAE v5.0's grades (none, 1, 2, 3: gradeFatigue). */
export const FATIGUE_LEVELS = ['none', 'eased-by-rest', 'limits-usual-activities', 'limits-self-care'] as const
export type FatigueLevel = (typeof FATIGUE_LEVELS)[number]

function requireInteger(value: number, name: string, minimum: number, maximum: number): void {
  if (!Number.isInteger(value) || value < minimum || value > maximum) {
    throw new RangeError(`${name} must be a whole number from ${minimum} to ${maximum}, got ${value}`)
  }
}

/*
 * Hot-flush score. Sloan JA et al., "Methodologic lessons learned from hot flash
 * studies", J Clin Oncol 2001;19:4280-4290: score = frequency x average severity, which
 * is the sum over flushes of count x severity weight. Weights mild 1, moderate 2,
 * severe 3, very severe 4 (weights from memory).
 */
export const HOT_FLUSH_WEIGHTS: Readonly<Record<HotFlushSeverity, number>> = {
  'none': 0,
  'mild': 1,
  'moderate': 2,
  'severe': 3,
  'very-severe': 4,
}

/** Daily hot-flush score from the number of flushes of each severity in a day. */
export function hotFlushScore(countsBySeverity: Partial<Record<HotFlushSeverity, number>>): number {
  let score = 0
  for (const severity of HOT_FLUSH_SEVERITIES) {
    const count = countsBySeverity[severity] ?? 0
    if (!Number.isFinite(count) || count < 0) {
      throw new RangeError(`The count of ${severity} hot flushes must be zero or more, got ${count}`)
    }
    score += count * HOT_FLUSH_WEIGHTS[severity]
  }
  return score
}

/**
 * The score from the diary's two answers: flushes on an average day and the worst
 * severity. It counts every flush at the worst severity, so it is an upper estimate of
 * Sloan's score (the diary does not ask the severity of each flush).
 */
export function hotFlushScoreFromDiary(perDay: number, worstSeverity: HotFlushSeverity): number {
  return hotFlushScore({ [worstSeverity]: perDay })
}

/*
 * International Prostate Symptom Score (the AUA symptom index). Barry MJ et al.,
 * J Urol 1992;148:1549-1557. Seven items scored 0-5 (incomplete emptying, frequency,
 * intermittency, urgency, weak stream, straining, nocturia), total 0-35: mild 0-7,
 * moderate 8-19, severe 20-35. The quality-of-life item (0-6) is reported beside the
 * total and never added to it.
 */
export type IpssBand = 'mild' | 'moderate' | 'severe'

export interface IpssResult {
  total: number
  band: IpssBand
  qualityOfLife: number | null
}

export function ipss(items: readonly number[], qualityOfLife?: number): IpssResult {
  if (items.length !== 7) {
    throw new RangeError(`IPSS has 7 items, got ${items.length}`)
  }
  items.forEach((item, index) => requireInteger(item, `IPSS item ${index + 1}`, 0, 5))
  if (qualityOfLife !== undefined) requireInteger(qualityOfLife, 'IPSS quality of life', 0, 6)

  const total = items.reduce((sum, item) => sum + item, 0)
  const band: IpssBand = total <= 7 ? 'mild' : total <= 19 ? 'moderate' : 'severe'
  return { total, band, qualityOfLife: qualityOfLife ?? null }
}

/*
 * PHQ-2 mood screen. Kroenke K, Spitzer RL, Williams JB, Med Care 2003;41:1284-1292.
 * Two items 0-3 (little interest or pleasure; feeling down), total 0-6; 3 or more is a
 * positive screen.
 */
export interface Phq2Result {
  total: number
  positive: boolean
}

export function phq2(interest: number, down: number): Phq2Result {
  requireInteger(interest, 'PHQ-2 interest item', 0, 3)
  requireInteger(down, 'PHQ-2 feeling-down item', 0, 3)
  const total = interest + down
  return { total, positive: total >= 3 }
}

/*
 * CTCAE v5.0 (NCI, 2017) style grades. Grades 4 and 5 are not reachable from a diary.
 */

/** The answers at grades 0, 1, 2 and 3, one each. */
type GradeRow<Answer> = readonly [Answer, Answer, Answer, Answer]

/**
 * The diary's one-choice answers that carry a grade, each row listing the answers at grades
 * 0, 1, 2 and 3 in turn: an answer's grade is its place in its row. The rows' sources are
 * at gradeFatigue and gradeConstipation.
 */
const GRADE_ROWS = {
  fatigue: FATIGUE_LEVELS,
  constipation: ['none', 'occasional', 'persistent', 'no-movement-despite-laxatives'],
} as const satisfies { fatigue: GradeRow<FatigueLevel>, constipation: GradeRow<ConstipationLevel> }

function gradeInRow<K extends keyof typeof GRADE_ROWS>(row: K, answer: (typeof GRADE_ROWS)[K][number]): CtcaeGrade {
  return (GRADE_ROWS[row] as readonly string[]).indexOf(answer) as CtcaeGrade
}

/**
 * Hot flashes, CTCAE v5.0: 1 mild; 2 moderate, limiting instrumental ADL (usual
 * activities); 3 severe, limiting self-care ADL. The grade follows how much the flushes
 * got in the way, as the CTCAE wording does; any flush at all is at least grade 1.
 * Worst severity alone does not raise the grade (our design).
 */
export function gradeHotFlashes(hotFlushes: {
  perDay: number
  worstSeverity: HotFlushSeverity
  interference: HotFlushInterference
}): CtcaeGrade {
  if (hotFlushes.interference === 'self-care') return 3
  if (hotFlushes.interference === 'usual-activities') return 2
  const present = hotFlushes.perDay > 0 || hotFlushes.worstSeverity !== 'none'
  return present ? 1 : 0
}

/**
 * Fatigue, CTCAE v5.0: 1 relieved by rest; 2 not relieved by rest, limiting
 * instrumental ADL; 3 not relieved by rest, limiting self-care ADL.
 */
export function gradeFatigue(fatigue: FatigueLevel): CtcaeGrade {
  return gradeInRow('fatigue', fatigue)
}

/**
 * Injection site reaction, CTCAE v5.0: 1 tenderness with or without warmth, redness or
 * itch; 2 pain, swelling (oedema), phlebitis; 3 ulceration or necrosis, severe tissue
 * damage, operative intervention indicated. Our mapping of the diary's answers: redness
 * or a lump -> 1; pain or swelling -> 2; fever, spreading redness or pus -> 3 (a sign of
 * infection that may need drainage; CTCAE grades infections separately, we place it at
 * grade 3 so it can never count as less than a painful site).
 */
export function gradeInjectionSite(site: {
  pain: boolean
  redness: boolean
  swelling: boolean
  lump: boolean
  feverOrSpreadingRednessOrPus: boolean
}): CtcaeGrade {
  if (site.feverOrSpreadingRednessOrPus) return 3
  if (site.pain || site.swelling) return 2
  if (site.redness || site.lump) return 1
  return 0
}

/**
 * Diarrhoea, CTCAE v5.0: 1 an increase of fewer than 4 stools a day over baseline; 2 an
 * increase of 4-6; 3 an increase of 7 or more (or limiting self-care). The diary asks the
 * increase over his usual directly.
 */
export function gradeDiarrhoea(extraStoolsPerDay: number): CtcaeGrade {
  requireInteger(extraStoolsPerDay, 'Extra stools a day', 0, 30)
  if (extraStoolsPerDay === 0) return 0
  if (extraStoolsPerDay < 4) return 1
  if (extraStoolsPerDay < 7) return 2
  return 3
}

/**
 * Constipation, CTCAE v5.0: 1 occasional, eased by diet or softeners; 2 persistent, with
 * regular laxatives, limiting instrumental ADL; 3 obstipation needing manual evacuation.
 * The diary's last choice ("no movement despite laxatives") is placed at grade 3 (our design).
 */
export function gradeConstipation(level: ConstipationLevel): CtcaeGrade {
  return gradeInRow('constipation', level)
}

/** A thermometer reading in degrees Celsius: °C = (°F - 32) x 5 / 9 (the definition of the scales). */
export function temperatureCelsius(reading: { unit: '°C' | '°F', value: number }): number {
  return reading.unit === '°C' ? reading.value : (reading.value - 32) * 5 / 9
}
