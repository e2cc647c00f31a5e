import type { LabKind } from '../labs/lab-triage'
import { addDays } from '../schedule/rules'
import type { RiskFactor } from '../triage/risk-profile'

/*
 * The monitoring plan: the checks a man on a GnRH-agonist depot has between injections,
 * each with an interval and a first-due date, from clinic defaults per regimen. These are
 * defaults that the clinic's licensed clinicians review and adapt; the clinician who owns
 * a patient's plan may change every item. This program does not replace medical advice.
 *
 * Dates are calendar dates 'YYYY-MM-DD' in the clinic's time zone (schedule/rules.ts).
 */

export const MONITORING_KINDS = [
  'testosterone',
  'psa',
  'glucose',
  'ecg',
  'electrolytes',
  'lipids',
  'bone-density',
  'vitamin-d',
  'blood-pressure',
  'weight',
] as const
export type MonitoringKind = (typeof MONITORING_KINDS)[number]

/** A lab or ECG result entered in Tidewell fulfils the item of this kind (QTc is read off an ECG). */
export const FULFILLED_BY_LAB: Record<LabKind, MonitoringKind> = {
  testosterone: 'testosterone',
  psa: 'psa',
  hba1c: 'glucose',
  qtc: 'ecg',
}

/** Kinds whose result Tidewell stores; the others are marked done by hand. */
export const LAB_BACKED_KINDS: readonly MonitoringKind[] = Object.values(FULFILLED_BY_LAB)

/**
 * Where each default comes from. "From memory" and "common practice" say so; the English
 * text is also in the locale under monitoring.sources, word for word.
 */
export const MONITORING_SOURCES = {
  labelLabTests: 'US prescribing information of the GnRH-agonist depot suspensions for prostate cancer, section 5 (Warnings and precautions, laboratory tests): monitor serum testosterone and PSA periodically',
  eauFollowUp: 'EAU prostate cancer guidelines, follow-up on hormonal therapy (from memory): testosterone at about 3 months to confirm a castrate level and again when PSA rises; PSA every 3 to 6 months',
  labelGlucose: 'US prescribing information of the GnRH-agonist depots, section 5 (Warnings and precautions, hyperglycaemia and diabetes): monitor blood glucose or HbA1c periodically',
  labelQt: 'US prescribing information of the GnRH-agonist depots, section 5 (Warnings and precautions, effect on the QT/QTc interval): consider periodic ECGs and electrolytes; correct electrolyte abnormalities',
  labelCardiovascular: 'US prescribing information of the GnRH-agonist depots, section 5 (Warnings and precautions, cardiovascular disease): watch for signs of cardiovascular disease; checked at each injection visit: common practice',
  lipidsAdvisory: 'Levine GN et al., Circulation 2010;121:833-840, science advisory on ADT and cardiovascular risk (from memory); yearly lipids: common practice',
  bone: 'Loss of bone mineral density on long-term ADT, US prescribing information of the GnRH-agonist depots (from memory for the section); a baseline scan and one every 2 years: common practice',
  commonPractice: 'Common practice',
} as const
export type MonitoringSourceKey = keyof typeof MONITORING_SOURCES

/** When an item is first due: days after the regimen start, or whole injection cycles after the last injection. */
export type FirstDueRule =
  | { from: 'regimen-start', days: number }
  | { from: 'last-injection', cycles: number }

export interface MonitoringDefault {
  kind: MonitoringKind
  /** Days between checks the clinic aims for. */
  targetDays: number
  /**
   * Done at the injection visit: the interval is the target rounded down to whole injection
   * cycles, and never less than one cycle (so a 6-month depot does not bring him in between).
   */
  atVisits: boolean
  firstDue: FirstDueRule
  /** Only for men with one of these risk factors; for the others the item starts inactive. */
  onlyWith?: readonly RiskFactor[]
  sources: readonly MonitoringSourceKey[]
}

/** Risk factors for QT prolongation on the risk profile (prescribing information, Warnings: QT). */
export const QT_RISK_FACTORS: readonly RiskFactor[] = ['heartDisease', 'longQt']

export const MONITORING_DEFAULTS: readonly MonitoringDefault[] = [
  { kind: 'testosterone', targetDays: 168, atVisits: true, firstDue: { from: 'regimen-start', days: 84 }, sources: ['labelLabTests', 'eauFollowUp'] },
  { kind: 'psa', targetDays: 84, atVisits: true, firstDue: { from: 'regimen-start', days: 84 }, sources: ['labelLabTests', 'eauFollowUp'] },
  { kind: 'glucose', targetDays: 168, atVisits: true, firstDue: { from: 'regimen-start', days: 0 }, sources: ['labelGlucose', 'commonPractice'] },
  { kind: 'ecg', targetDays: 168, atVisits: false, firstDue: { from: 'regimen-start', days: 0 }, onlyWith: QT_RISK_FACTORS, sources: ['labelQt', 'commonPractice'] },
  { kind: 'electrolytes', targetDays: 168, atVisits: true, firstDue: { from: 'regimen-start', days: 0 }, onlyWith: QT_RISK_FACTORS, sources: ['labelQt', 'commonPractice'] },
  { kind: 'lipids', targetDays: 365, atVisits: true, firstDue: { from: 'regimen-start', days: 84 }, sources: ['lipidsAdvisory'] },
  { kind: 'bone-density', targetDays: 730, atVisits: false, firstDue: { from: 'regimen-start', days: 0 }, sources: ['bone'] },
  { kind: 'vitamin-d', targetDays: 365, atVisits: true, firstDue: { from: 'regimen-start', days: 0 }, sources: ['commonPractice'] },
  // A target of 1 day at visits: at every injection visit.
  { kind: 'blood-pressure', targetDays: 1, atVisits: true, firstDue: { from: 'last-injection', cycles: 1 }, sources: ['labelCardiovascular'] },
  { kind: 'weight', targetDays: 1, atVisits: true, firstDue: { from: 'last-injection', cycles: 1 }, sources: ['commonPractice'] },
]

/** The interval of a default on a regimen of `cycleDays` between injections. */
export function defaultIntervalDays(entry: Pick<MonitoringDefault, 'targetDays' | 'atVisits'>, cycleDays: number): number {
  if (!entry.atVisits) return entry.targetDays
  return Math.max(1, Math.floor(entry.targetDays / cycleDays)) * cycleDays
}

/** One item of a patient's plan, as the rules read it. */
export interface PlanItem {
  kind: MonitoringKind
  intervalDays: number
  firstDueOn: string
  lastDoneOn: string | null
  active: boolean
  note: string | null
}

export interface RegimenStart {
  /** Days between injections of his current regimen. */
  cycleDays: number
  startsOn: string
  /** His last injection on this regimen, or null before the first. */
  lastInjectionOn: string | null
}

const later = (a: string, b: string) => (a > b ? a : b)

/**
 * The first-due date of a default: from the regimen start, or whole cycles after his last
 * injection (the start when there is none yet). Never before `today`: a check that was
 * never done on a plan made late is due now, not "overdue for two years".
 */
export function firstDueOf(rule: FirstDueRule, regimen: RegimenStart, today: string): string {
  const date = rule.from === 'regimen-start'
    ? addDays(regimen.startsOn, rule.days)
    : addDays(regimen.lastInjectionOn ?? regimen.startsOn, rule.cycles * regimen.cycleDays)
  return later(date, today)
}

/**
 * The plan from the clinic defaults for his current regimen. Items he already has keep
 * their last-done date, their note and whether they are active; their interval follows the
 * regimen, and the first-due date is worked again from the regimen's start. A new item is
 * active unless it is for men with a risk factor he does not have.
 */
export function planFromDefaults(regimen: RegimenStart, today: string, risks: readonly RiskFactor[], existing: readonly PlanItem[] = []): PlanItem[] {
  return MONITORING_DEFAULTS.map((entry) => {
    const kept = existing.find(item => item.kind === entry.kind)
    return {
      kind: entry.kind,
      intervalDays: defaultIntervalDays(entry, regimen.cycleDays),
      firstDueOn: firstDueOf(entry.firstDue, regimen, today),
      lastDoneOn: kept?.lastDoneOn ?? null,
      active: kept ? kept.active : !entry.onlyWith || entry.onlyWith.some(factor => risks.includes(factor)),
      note: kept?.note ?? null,
    }
  })
}

/**
 * When the item is next due: its interval after the last time it was done, or its first-due
 * date when it never was. A testosterone check is also due on the day a PSA was found
 * rising after the last testosterone (EAU follow-up, from memory): `psaRiseOn`.
 */
export function nextDueOn(item: Pick<PlanItem, 'kind' | 'intervalDays' | 'firstDueOn' | 'lastDoneOn'>, psaRiseOn: string | null = null): string {
  const planned = item.lastDoneOn ? addDays(item.lastDoneOn, item.intervalDays) : item.firstDueOn
  if (item.kind !== 'testosterone' || !psaRiseOn) return planned
  if (item.lastDoneOn && psaRiseOn <= item.lastDoneOn) return planned
  return psaRiseOn < planned ? psaRiseOn : planned
}

/** The last time done after a result or a "done" taken on `doneOn` (an older date changes nothing). */
export function doneAfter(lastDoneOn: string | null, doneOn: string): string {
  return lastDoneOn ? later(lastDoneOn, doneOn) : doneOn
}

export const DUE_STATES = ['overdue', 'due-this-month', 'later'] as const
export type MonitoringDueState = (typeof DUE_STATES)[number]

/** Overdue before today; due this month up to the last day of today's calendar month; later after it. */
export function dueState(dueOn: string, today: string): MonitoringDueState {
  if (dueOn < today) return 'overdue'
  // Day 1 of this month plus 31 days always lands in the next month.
  const nextMonth = addDays(`${today.slice(0, 7)}-01`, 31).slice(0, 7)
  const endOfMonth = addDays(`${nextMonth}-01`, -1)
  return dueOn <= endOfMonth ? 'due-this-month' : 'later'
}

/** Reminders to the patient start this many days before an item is due (common practice). */
export const MONITORING_REMINDER_DAYS = 14
