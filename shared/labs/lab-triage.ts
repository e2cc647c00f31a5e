import {
  a1cCategory, a1cIfccMmolPerMol, assessQtc, castrateStatus, estimatedAverageGlucoseMgDl,
  estimatedAverageGlucoseMmolL, psaDoublingTimeFromResults,
} from './calculations'
import type { DatedPsaDoublingTime, GlycaemicCategory, TestosteroneUnit } from './calculations'
import { daysBetween } from '../schedule/rules'
import { compareLevels } from '../triage/rules'
import type { TriageLevel, TriageReason } from '../triage/rules'

/*
 * What a lab result means and whether it needs a nurse: the interpretation (from labs.ts)
 * and a small table of rules, each with its source. These are clinic defaults: the
 * clinic's licensed clinicians review and adapt them. This program does not replace
 * medical advice.
 */

export const LAB_KINDS = ['testosterone', 'psa', 'hba1c', 'qtc'] as const
export type LabKind = (typeof LAB_KINDS)[number]

export const TESTOSTERONE_UNITS = ['ng/dL', 'nmol/L'] as const satisfies readonly TestosteroneUnit[]

/** The unit each kind is stored in (testosterone as entered). */
export const FIXED_UNITS = { psa: 'ng/mL', hba1c: '%', qtc: 'ms' } as const

/**
 * Castrate levels are usually reached two to four weeks after the first depot injection
 * (from memory); a testosterone taken earlier is not yet "on therapy" for the escape rule.
 */
export const ON_THERAPY_AFTER_DAYS = 28

/** One stored result, as the rules and the interpretation read it. */
export interface LabReading {
  id: number
  kind: LabKind
  takenOn: string
  /** Testosterone in its unit; PSA ng/mL; HbA1c %; QTc: the measured QT in ms. */
  value: number
  unit: string
  /** QTc only: heart rate in beats per minute. */
  heartRate: number | null
}

export type LabInterpretation =
  | { kind: 'testosterone', ngPerDl: number, nmolPerL: number, castrate: boolean, belowStrictLevel: boolean, onTherapy: boolean }
  | { kind: 'psa', ngPerMl: number, valuesUsed: number, doubling: DatedPsaDoublingTime }
  | { kind: 'hba1c', percent: number, eagMgDl: number, eagMmolL: number, ifccMmolPerMol: number, category: GlycaemicCategory }
  | { kind: 'qtc', qtMs: number, heartRate: number, bazett: number, fridericia: number, grade: 0 | 1 | 2 | 3, highRisk: boolean, baselineFridericia: number | null, riseMs: number | null }

export interface LabContext {
  /** His other results of any kind (the interpretation picks what it needs). */
  history: readonly LabReading[]
  /** Date of his first depot injection ('YYYY-MM-DD'), or null when none is recorded. */
  firstInjectionOn: string | null
}

const byDate = (a: LabReading, b: LabReading) => a.takenOn.localeCompare(b.takenOn) || a.id - b.id

/**
 * The interpretation of one result. PSA: the doubling time over his PSA values since their
 * nadir, up to this one. QTc: the rise is measured from his first QTc before this one (his baseline).
 */
export function interpretLab(reading: LabReading, context: LabContext): LabInterpretation {
  switch (reading.kind) {
    case 'testosterone': {
      const status = castrateStatus(reading.value, reading.unit as TestosteroneUnit)
      const onTherapy = context.firstInjectionOn !== null && daysBetween(context.firstInjectionOn, reading.takenOn) >= ON_THERAPY_AFTER_DAYS
      return { kind: 'testosterone', ...status, onTherapy }
    }
    case 'psa': {
      const upToThis = [...context.history.filter(r => r.kind === 'psa' && r.id !== reading.id && byDate(r, reading) < 0), reading].sort(byDate)
      const doubling = psaDoublingTimeFromResults(upToThis.map(r => ({ date: r.takenOn, psa: r.value })))
      return { kind: 'psa', ngPerMl: reading.value, valuesUsed: doubling.valuesUsed, doubling }
    }
    case 'hba1c':
      return {
        kind: 'hba1c',
        percent: reading.value,
        eagMgDl: estimatedAverageGlucoseMgDl(reading.value),
        eagMmolL: estimatedAverageGlucoseMmolL(reading.value),
        ifccMmolPerMol: a1cIfccMmolPerMol(reading.value),
        category: a1cCategory(reading.value),
      }
    case 'qtc': {
      const heartRate = reading.heartRate ?? 0
      const baseline = context.history.filter(r => r.kind === 'qtc' && r.id !== reading.id && byDate(r, reading) < 0).sort(byDate)[0]
      const baselineFridericia = baseline ? assessQtc(baseline.value, baseline.heartRate ?? 0).fridericia : null
      const assessment = assessQtc(reading.value, heartRate, baselineFridericia ?? undefined)
      return {
        kind: 'qtc',
        qtMs: reading.value,
        heartRate,
        ...assessment,
        baselineFridericia,
        riseMs: baselineFridericia === null ? null : Math.round(assessment.fridericia) - Math.round(baselineFridericia),
      }
    }
  }
}

export const LAB_SOURCES = {
  escape: 'Oefelein MG et al., Urology 2000 (castrate level below 50 ng/dL); EAU prostate cancer guidelines (wording from memory): a level at or above it on therapy is possible testosterone escape',
  ctcae: 'CTCAE v5.0 (NCI, 2017), Electrocardiogram QT corrected interval prolonged; grade from Fridericia\'s QTc',
  ada: 'ADA Standards of Care 2025, Diabetes Care 48(Suppl 1): A1C 6.5 % or more is in the diabetes range',
  psaDt: 'Pound CR et al., JAMA 1999 (log-linear doubling time); under 3 months needs a clinician\'s look: common practice, from memory',
} as const

export interface LabRule {
  id: string
  level: TriageLevel
  source: string
  /** Locale key of the reason the nurse reads. */
  reasonKey: string
  /** Locale key of what the nurse does next. */
  instructionKey: string
  test: (result: LabInterpretation) => boolean
}

function rule(id: string, level: TriageLevel, source: string, test: LabRule['test']): LabRule {
  return { id, level, source, reasonKey: `labs.rules.${id}.reason`, instructionKey: `labs.rules.${id}.instruction`, test }
}

/** PSA doubling time below this many months raises a routine item. */
export const PSA_DOUBLING_ROUTINE_MONTHS = 3

export const LAB_RULES: readonly LabRule[] = [
  rule('testosterone-escape', 'urgent', LAB_SOURCES.escape, r => r.kind === 'testosterone' && r.onTherapy && !r.castrate),
  rule('qtc-grade-3', 'urgent', LAB_SOURCES.ctcae, r => r.kind === 'qtc' && r.grade === 3),
  rule('qtc-grade-2', 'routine', LAB_SOURCES.ctcae, r => r.kind === 'qtc' && r.grade === 2),
  rule('a1c-diabetes-range', 'routine', LAB_SOURCES.ada, r => r.kind === 'hba1c' && r.category === 'diabetes'),
  rule('psa-fast-doubling', 'routine', LAB_SOURCES.psaDt, r => r.kind === 'psa' && r.doubling.status === 'rising' && r.doubling.months < PSA_DOUBLING_ROUTINE_MONTHS),
]

export interface LabTriage {
  level: TriageLevel
  /** Every rule that fired, highest level first. */
  reasons: TriageReason[]
}

export function evaluateLabTriage(result: LabInterpretation): LabTriage {
  const reasons = LAB_RULES.filter(r => r.test(result))
    .map(r => ({ rule: r.id, level: r.level, reasonKey: r.reasonKey, instructionKey: r.instructionKey, source: r.source }))
    .sort((a, b) => compareLevels(b.level, a.level))
  const level = reasons.reduce<TriageLevel>((worst, r) => (compareLevels(r.level, worst) > 0 ? r.level : worst), 'none')
  return { level, reasons }
}
