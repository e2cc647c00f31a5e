import { DateTime } from 'luxon'
import type { DiaryEntryInput } from '../schemas/diary'
import type { RiskFactor, RiskProfile } from './risk-profile'
import { glucoseToMgDl } from './labs'
import { gradeFatigue, gradeHotFlashes, gradeInjectionSite, ipss, phq2 } from './scores'
import type { CtcaeGrade } from './scores'

/*
 * Triage of a weekly diary entry. The same function runs in the page (for the instant
 * right-now screen) and on the server, which is the authority.
 *
 * Two tables of rules:
 * - TRIAGE_RULES set a fixed level when their test is true;
 * - RAISE_RULES (worse than his own baseline, flare watch) raise a symptom one level:
 *   they start from the highest level reached by the fixed rules about the same symptom
 *   (`symptomRules`, 'none' if none of them fired), go one step up and stay within the
 *   limits each one states. Raising the symptom rather than the whole entry keeps an
 *   unrelated finding from being pushed up with it.
 * The entry's level is the highest level any rule reaches; every rule that fired is kept
 * as a reason. A free-text note never changes the level; it is flagged for the nurse.
 *
 * These are defaults: the clinic's licensed clinicians review and adapt them to local
 * protocols. This program does not replace medical advice.
 */

/** Triage levels from lowest to highest. */
export const LEVELS = ['none', 'routine', 'urgent', 'emergency'] as const
export type TriageLevel = (typeof LEVELS)[number]

/** Negative when `a` is lower than `b`, zero when equal, positive when higher. */
export function compareLevels(a: TriageLevel, b: TriageLevel): number {
  return LEVELS.indexOf(a) - LEVELS.indexOf(b)
}

function higher(a: TriageLevel, b: TriageLevel): TriageLevel {
  return compareLevels(a, b) >= 0 ? a : b
}

function lower(a: TriageLevel, b: TriageLevel): TriageLevel {
  return compareLevels(a, b) <= 0 ? a : b
}

function oneStepUp(level: TriageLevel): TriageLevel {
  return LEVELS[Math.min(LEVELS.indexOf(level) + 1, LEVELS.length - 1)] ?? 'emergency'
}

/** Changes whenever a rule, a threshold or a source changes; stored with each result. */
export const RULES_VERSION = 'tidewell-triage-3'

/** The right-now check, in the order the diary asks it. */
export const RIGHT_NOW_ITEMS = [
  'newWeakness',
  'newNumbness',
  'troubleWalking',
  'bladderBowelControl',
  'cannotPassUrine',
  'chestPain',
  'hardToBreathe',
  'faceDroopSpeech',
  'seizure',
  'faceThroatSwelling',
  'selfHarmThoughts',
] as const
export type RightNowItem = (typeof RIGHT_NOW_ITEMS)[number]

export const PAIN_LOCATIONS = ['back', 'neck', 'ribs', 'hips', 'legs', 'arms', 'other'] as const
export type PainLocation = (typeof PAIN_LOCATIONS)[number]

/** Pain felt in the spine (NICE NG234: cervical, thoracic or lumbar spine pain). */
const SPINE_LOCATIONS: readonly PainLocation[] = ['back', 'neck']

/** Where bone pain from metastases is felt; "other" may not be bone. */
const BONE_LOCATIONS: readonly PainLocation[] = ['back', 'neck', 'ribs', 'hips', 'legs', 'arms']

const SOURCES = {
  nice: 'NICE guideline NG234 (2023), Spinal metastases and metastatic spinal cord compression',
  flare: 'GnRH-agonist depot prescribing information, Warnings (tumour flare); common practice',
  commonPractice: 'Common practice (emergency care)',
  selfHarm: 'Kroenke K et al., Med Care 2003 (PHQ-2); any thought of self-harm is an emergency: common practice',
  serlin: 'Serlin RC et al., Pain 1995 (7-10 is severe); new or worse: common practice',
  ctcae: 'CTCAE v5.0 (NCI, 2017)',
  glucose: 'Home glucose at or above 300 mg/dL (16.7 mmol/L) needs same-day advice: from memory',
  ada: 'ADA Standards of Care 2025 (symptoms of high blood sugar); common practice',
  barry: 'Barry MJ et al., J Urol 1992 (IPSS 20-35 is severe)',
  kroenke: 'Kroenke K et al., Med Care 2003 (PHQ-2 of 3 or more is a positive screen)',
  basch: 'Basch E et al., J Clin Oncol 2016 (alerts on worsening symptoms); thresholds from memory',
  cardiac: 'GnRH-agonist depot prescribing information, Warnings (cardiovascular disease, QT prolongation); routine review: common practice',
  note: 'Common practice: every free-text note is read by a person (Tidewell issue 9)',
  urinaryInfection: 'Burning on passing urine may be a urinary infection; routine review: common practice',
} as const

export interface Baseline {
  /** Median worst pain (0-10) of the previous entries. */
  pain: number
  /** Median CTCAE-style grades of the previous entries. */
  hotFlushes: number
  fatigue: number
  injectionSite: number
}

/** What a rule's test can see besides the entry. */
export interface RuleContext {
  flareWatchActive: boolean
  /** Medians of his last four entries; null when there are none. */
  baseline: Baseline | null
  /** The risk profile on his record; absent means no factor is known. */
  riskProfile?: RiskProfile
}

interface RuleCommon {
  id: string
  source: string
  /** Locale key of the reason the nurse reads. */
  reasonKey: string
  /** Locale key of what the patient is told to do. */
  instructionKey: string
  test: (entry: DiaryEntryInput, context: RuleContext) => boolean
}

export interface TriageRule extends RuleCommon {
  level: TriageLevel
}

/** What raised a symptom one step: his own last report, the flare watch, or a risk factor on his record. */
export type RaisedBy = 'baseline' | 'flare-watch' | 'risk'

export interface RaiseRule extends RuleCommon {
  raisedBy: RaisedBy
  /** The risk factor behind a 'risk' raise. */
  riskFactor?: RiskFactor
  /** Ids of the fixed rules about the same symptom; the raise starts from the highest that fired. */
  symptomRules: readonly string[]
  /** The raised level is never lower than this. */
  atLeast: TriageLevel
  /** The raised level is never higher than this. */
  atMost: TriageLevel
}

function keys(id: string, instructionId = id) {
  return {
    reasonKey: `triage.rules.${id}.reason`,
    instructionKey: `triage.rules.${instructionId}.instruction`,
  }
}

function rule(id: string, level: TriageLevel, source: string, test: TriageRule['test']): TriageRule {
  return { id, level, source, ...keys(id), test }
}

function rightNowRule(id: string, item: RightNowItem, source: string): TriageRule {
  return rule(id, 'emergency', source, entry => entry.rightNow[item])
}

const hasAny = (locations: readonly PainLocation[], wanted: readonly PainLocation[]) =>
  locations.some(location => wanted.includes(location))

const hotFlushGrade = (entry: DiaryEntryInput): CtcaeGrade => gradeHotFlashes(entry.hotFlushes)
const fatigueGrade = (entry: DiaryEntryInput): CtcaeGrade => gradeFatigue(entry.fatigue)
const injectionSiteGrade = (entry: DiaryEntryInput): CtcaeGrade => gradeInjectionSite(entry.injectionSite)

export const TRIAGE_RULES: readonly TriageRule[] = [
  // Emergency: any right-now item. Call the local emergency number now.
  rightNowRule('right-now-weakness', 'newWeakness', SOURCES.nice),
  rightNowRule('right-now-numbness', 'newNumbness', SOURCES.nice),
  rightNowRule('right-now-walking', 'troubleWalking', SOURCES.nice),
  rightNowRule('right-now-bladder-bowel', 'bladderBowelControl', SOURCES.nice),
  rightNowRule('right-now-cannot-pass-urine', 'cannotPassUrine', `${SOURCES.flare}; acute urinary retention`),
  rightNowRule('right-now-chest-pain', 'chestPain', SOURCES.commonPractice),
  rightNowRule('right-now-breathing', 'hardToBreathe', SOURCES.commonPractice),
  rightNowRule('right-now-stroke-signs', 'faceDroopSpeech', SOURCES.commonPractice),
  rightNowRule('right-now-seizure', 'seizure', SOURCES.commonPractice),
  rightNowRule('right-now-face-throat-swelling', 'faceThroatSwelling', `${SOURCES.commonPractice}; anaphylaxis`),
  rightNowRule('right-now-self-harm', 'selfHarmThoughts', SOURCES.selfHarm),

  // Urgent: a nurse calls the same day.
  rule('spinal-pain-pattern', 'urgent', SOURCES.nice, ({ pain }) =>
    pain.bandLike
    || (hasAny(pain.locations, SPINE_LOCATIONS) && (pain.newOrWorse || pain.wakesAtNight || pain.worseOnStraining))),
  rule('severe-pain-new-or-worse', 'urgent', SOURCES.serlin, ({ pain }) =>
    pain.worst >= 7 && pain.newOrWorse),
  rule('blood-in-urine', 'urgent', SOURCES.commonPractice, ({ urinary }) => urinary.blood),
  rule('fainting', 'urgent', SOURCES.commonPractice, ({ heart }) => heart.fainting),
  rule('injection-site-infection', 'urgent', SOURCES.commonPractice, ({ injectionSite }) =>
    injectionSite.feverOrSpreadingRednessOrPus),
  rule('glucose-very-high', 'urgent', SOURCES.glucose, ({ sugar }) =>
    sugar.glucose !== undefined && glucoseToMgDl(sugar.glucose) >= 300),
  rule('hot-flushes-grade-3', 'urgent', SOURCES.ctcae, entry => hotFlushGrade(entry) === 3),
  rule('fatigue-grade-3', 'urgent', SOURCES.ctcae, entry => fatigueGrade(entry) === 3),

  // Routine: a nurse is in touch within a few working days.
  rule('ipss-severe', 'routine', SOURCES.barry, ({ urinary }) =>
    urinary.ipss !== undefined && ipss(urinary.ipss.items).band === 'severe'),
  rule('phq2-positive', 'routine', SOURCES.kroenke, ({ mood }) =>
    phq2(mood.phq2Interest, mood.phq2Down).positive),
  rule('high-sugar-symptoms', 'routine', SOURCES.ada, ({ sugar }) =>
    (sugar.veryThirsty || sugar.urinatingMore || sugar.blurredVision)),
  rule('hot-flushes-grade-2', 'routine', SOURCES.ctcae, entry => hotFlushGrade(entry) === 2),
  rule('fatigue-grade-2', 'routine', SOURCES.ctcae, entry => fatigueGrade(entry) === 2),
  rule('injection-site-signs', 'routine', `${SOURCES.ctcae}, injection site reaction`, ({ injectionSite }) =>
    injectionSite.pain || injectionSite.redness || injectionSite.swelling || injectionSite.lump),
  rule('heart-racing-or-irregular', 'routine', SOURCES.cardiac, ({ heart }) => heart.racingOrIrregular),
  rule('leg-swelling', 'routine', SOURCES.cardiac, ({ heart }) => heart.legSwelling),
  rule('breathless-light-effort', 'routine', SOURCES.cardiac, ({ heart }) => heart.breathlessLightEffort),
  rule('burning-urine', 'routine', SOURCES.urinaryInfection, ({ urinary }) => urinary.burning),
  // Every note is read by a person: a note alone opens a routine "note to read" item.
  rule('note-to-read', 'routine', SOURCES.note, entry => (entry.note ?? '').trim().length > 0),
]

function baselineRule(id: string, symptomRules: readonly string[], test: RaiseRule['test']): RaiseRule {
  return {
    id,
    raisedBy: 'baseline',
    symptomRules,
    atLeast: 'none',
    atMost: 'urgent',
    source: SOURCES.basch,
    ...keys(id),
    test,
  }
}

function flareRule(id: string, symptomRules: readonly string[], test: (entry: DiaryEntryInput) => boolean): RaiseRule {
  return {
    id,
    raisedBy: 'flare-watch',
    symptomRules,
    atLeast: 'urgent',
    atMost: 'emergency',
    source: `${SOURCES.flare}; ${SOURCES.nice}`,
    ...keys(id),
    test: (entry, context) => context.flareWatchActive && test(entry),
  }
}

const PAIN_RULES = ['spinal-pain-pattern', 'severe-pain-new-or-worse']

/** A graded symptom counts as worse at 2 grades above his median (from memory). */
const GRADE_RISE = 2
/** Pain counts as worse at 3 points above his median (from memory). */
const PAIN_RISE = 3

export const RAISE_RULES: readonly RaiseRule[] = [
  // Worse than his own baseline: one step up, at most to urgent.
  baselineRule('baseline-pain', PAIN_RULES, (entry, { baseline }) =>
    baseline !== null && entry.pain.worst - baseline.pain >= PAIN_RISE),
  baselineRule('baseline-hot-flushes', ['hot-flushes-grade-3', 'hot-flushes-grade-2'], (entry, { baseline }) =>
    baseline !== null && hotFlushGrade(entry) - baseline.hotFlushes >= GRADE_RISE),
  baselineRule('baseline-fatigue', ['fatigue-grade-3', 'fatigue-grade-2'], (entry, { baseline }) =>
    baseline !== null && fatigueGrade(entry) - baseline.fatigue >= GRADE_RISE),
  baselineRule('baseline-injection-site', ['injection-site-infection', 'injection-site-signs'], (entry, { baseline }) =>
    baseline !== null && injectionSiteGrade(entry) - baseline.injectionSite >= GRADE_RISE),

  // Flare watch: one step up, at least urgent. Pain with no place ticked counts as
  // possible bone pain; pain only in "other" places does not.
  flareRule('flare-watch-bone-pain', PAIN_RULES, ({ pain }) =>
    pain.worst >= 4 && pain.newOrWorse
    && (pain.locations.length === 0 || hasAny(pain.locations, BONE_LOCATIONS))),
  flareRule('flare-watch-urinary', ['right-now-cannot-pass-urine', 'ipss-severe'], ({ urinary, rightNow }) =>
    urinary.weakStreamOrStraining || rightNow.cannotPassUrine),
  flareRule('flare-watch-tingling', ['right-now-numbness'], ({ pain, rightNow }) =>
    pain.tinglingOrNumbness || rightNow.newNumbness),
]

function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b)
  const middle = Math.floor(sorted.length / 2)
  const upper = sorted[middle] ?? 0
  return sorted.length % 2 === 1 ? upper : ((sorted[middle - 1] ?? 0) + upper) / 2
}

export const BASELINE_ENTRIES = 4

/** Medians of the last four entries (given most recent first); null when there are none. */
export function baselineOf(previous: readonly DiaryEntryInput[]): Baseline | null {
  const recent = previous.slice(0, BASELINE_ENTRIES)
  if (recent.length === 0) return null
  return {
    pain: median(recent.map(entry => entry.pain.worst)),
    hotFlushes: median(recent.map(hotFlushGrade)),
    fatigue: median(recent.map(fatigueGrade)),
    injectionSite: median(recent.map(injectionSiteGrade)),
  }
}

export interface TriageTargets {
  /** Urgent: a nurse responds within this many hours (clinic setting). */
  urgentHours?: number
  /** Routine: within this many working days, Monday to Friday (clinic setting). */
  routineWorkingDays?: number
}

export interface TriageContext {
  flareWatchActive: boolean
  /** His previous entries, most recent first; the first four are used. */
  baseline: readonly DiaryEntryInput[]
  submittedAt: Date
  /** The clinic's time zone, for counting working days. Defaults to UTC. */
  timeZone?: string
  targets?: TriageTargets
  /** The risk profile on his record (nurses and clinicians set it); absent means none known. */
  riskProfile?: RiskProfile
}

export interface TriageReason {
  rule: string
  level: TriageLevel
  reasonKey: string
  instructionKey: string
  source: string
  raisedBy?: RaisedBy
  /** The risk factor behind a 'risk' raise. */
  riskFactor?: RiskFactor
}

export interface TriageResult {
  level: TriageLevel
  /** Locale key of what the patient does now at this level (see `levelInstructionKey`). */
  instructionKey: string
  /** Every rule that fired, highest level first, then in table order. */
  reasons: TriageReason[]
  /** When the nurse should respond; null when no response is needed. */
  respondBy: Date | null
  noteFlagged: boolean
  rulesVersion: string
}

function addWorkingDays(start: Date, workingDays: number, timeZone: string): Date {
  let day = DateTime.fromJSDate(start, { zone: timeZone })
  if (!day.isValid) throw new RangeError(`Unknown time zone "${timeZone}"`)
  let counted = 0
  while (counted < workingDays) {
    day = day.plus({ days: 1 })
    if (day.weekday <= 5) counted += 1
  }
  return day.toJSDate()
}

/**
 * The nurse's response target: emergency at once (the patient is told to call the
 * emergency number now and the nurse is alerted); urgent within `urgentHours` (default
 * 4); routine within `routineWorkingDays` working days (default 3; Saturdays and Sundays
 * do not count, public holidays are not known here); none needs no response.
 */
export function respondBy(level: TriageLevel, submittedAt: Date, targets: TriageTargets = {}, timeZone = 'UTC'): Date | null {
  const { urgentHours = 4, routineWorkingDays = 3 } = targets
  switch (level) {
    case 'emergency':
      return new Date(submittedAt.getTime())
    case 'urgent':
      return new Date(submittedAt.getTime() + urgentHours * 60 * 60 * 1000)
    case 'routine':
      return addWorkingDays(submittedAt, routineWorkingDays, timeZone)
    case 'none':
      return null
  }
}

/**
 * The headline instruction for a level, shown before the reasons' own instructions. The
 * texts take {number} (emergency number), {hours} (urgent target) and {days} (routine
 * target); every rule's instruction may take {number} and {crisisLine}.
 */
export function levelInstructionKey(level: TriageLevel): string {
  return `triage.levelInstructions.${level}`
}

function reasonOf(rule: RuleCommon, level: TriageLevel, raisedBy?: TriageReason['raisedBy']): TriageReason {
  const reason: TriageReason = {
    rule: rule.id,
    level,
    reasonKey: rule.reasonKey,
    instructionKey: rule.instructionKey,
    source: rule.source,
  }
  if (raisedBy) reason.raisedBy = raisedBy
  return reason
}

export function evaluateTriage(entry: DiaryEntryInput, context: TriageContext): TriageResult {
  const ruleContext: RuleContext = {
    flareWatchActive: context.flareWatchActive,
    baseline: baselineOf(context.baseline),
    riskProfile: context.riskProfile,
  }

  const reasons = TRIAGE_RULES
    .filter(rule => rule.test(entry, ruleContext))
    .map(rule => reasonOf(rule, rule.level))

  // Each raise starts from the fixed rules only, so two raises never stack.
  const fixedReasons = [...reasons]
  for (const rule of RAISE_RULES) {
    if (!rule.test(entry, ruleContext)) continue
    const symptomLevel = fixedReasons
      .filter(reason => rule.symptomRules.includes(reason.rule))
      .reduce<TriageLevel>((level, reason) => higher(level, reason.level), 'none')
    const raised = lower(higher(oneStepUp(symptomLevel), rule.atLeast), rule.atMost)
    reasons.push(reasonOf(rule, raised, rule.raisedBy))
  }

  reasons.sort((a, b) => compareLevels(b.level, a.level))
  const level = reasons[0]?.level ?? 'none'

  return {
    level,
    instructionKey: levelInstructionKey(level),
    reasons,
    respondBy: respondBy(level, context.submittedAt, context.targets, context.timeZone),
    noteFlagged: (entry.note ?? '').trim().length > 0,
    rulesVersion: RULES_VERSION,
  }
}

export interface RightNowCheck {
  /** Any right-now item answered yes: show the emergency instructions at once. */
  emergency: boolean
  /** Thoughts of self-harm: show the crisis line as well. */
  selfHarm: boolean
  items: RightNowItem[]
}

/** The right-now check alone, for the page to show emergency instructions instantly. */
export function rightNowTriggered(rightNow: DiaryEntryInput['rightNow']): RightNowCheck {
  const items = RIGHT_NOW_ITEMS.filter(item => rightNow[item])
  return { emergency: items.length > 0, selfHarm: rightNow.selfHarmThoughts, items }
}
