import { describe, expect, it } from 'vitest'
import en from '../../locales/en.json'
import es from '../../locales/es.json'
import {
  LEVELS,
  RAISE_RULES,
  RIGHT_NOW_ITEMS,
  RULES_VERSION,
  TRIAGE_RULES,
  baselineOf,
  compareLevels,
  evaluateTriage,
  levelInstructionKey,
  respondBy,
  rightNowTriggered,
} from '#shared/triage/rules'
import type { TriageContext, TriageLevel } from '#shared/triage/rules'
import { addDays, flareWatch } from '#shared/schedule/rules'
import { emptyRiskProfile } from '#shared/triage/risk-profile'
import type { RiskFactor } from '#shared/triage/risk-profile'
import { gradeConstipation, gradeDiarrhoea, temperatureCelsius } from '#shared/diary/scores'
import { emptyDiaryEntry } from '#shared/diary/schemas'
import type { DiaryEntryInput } from '#shared/diary/schemas'

// Wednesday 2025-03-12 15:00 UTC.
const SUBMITTED_AT = new Date('2025-03-12T15:00:00Z')
const HOUR = 60 * 60 * 1000

type Change = (entry: DiaryEntryInput) => void

function entryWith(...changes: Change[]): DiaryEntryInput {
  const entry = emptyDiaryEntry()
  for (const change of changes) change(entry)
  return entry
}

function triage(entry: DiaryEntryInput, context: Partial<TriageContext> = {}) {
  return evaluateTriage(entry, { flareWatchActive: false, baseline: [], submittedAt: SUBMITTED_AT, ...context })
}

const firedRules = (entry: DiaryEntryInput, context?: Partial<TriageContext>) =>
  triage(entry, context).reasons.map(reason => reason.rule)

const painOf = (worst: number, ...locations: DiaryEntryInput['pain']['locations']): Change => (entry) => {
  entry.pain.worst = worst
  entry.pain.locations = locations
}
const newOrWorse: Change = (entry) => {
  entry.pain.newOrWorse = true
}
const tingling: Change = (entry) => {
  entry.pain.tinglingOrNumbness = true
}
const weakStream: Change = (entry) => {
  entry.urinary.weakStreamOrStraining = true
}
const ipssItems = (items: number[]): Change => (entry) => {
  entry.urinary.ipss = { items, qualityOfLife: 3 }
}
const glucose = (value: number, unit: 'mg/dL' | 'mmol/L'): Change => (entry) => {
  entry.sugar.glucose = { value, unit }
}

/** Four earlier entries with the same mild answers: a steady baseline. */
const steadyBaseline = (...changes: Change[]) => Array.from({ length: 4 }, () => entryWith(...changes))

const temperature = (value: number, unit: '°C' | '°F' = '°C'): Change => (entry) => {
  entry.infection.any = true
  entry.infection.temperature = { value, unit }
}
const yes = (section: 'infection' | 'falls' | 'allergy' | 'mind' | 'headache', answer = 'any'): Change => (entry) => {
  (entry[section] as Record<string, unknown>)[answer] = true
}
const bowel = (changes: Partial<DiaryEntryInput['bowel']>): Change => (entry) => {
  entry.bowel = { ...entry.bowel, any: true, ...changes }
}
const heart = (...signs: (keyof DiaryEntryInput['heart'])[]): Change => (entry) => {
  for (const sign of signs) entry.heart[sign] = true
}
/** A context with these risk factors on his record. */
const risk = (...factors: RiskFactor[]): Partial<TriageContext> => {
  const riskProfile = emptyRiskProfile()
  for (const factor of factors) riskProfile[factor] = true
  return { riskProfile }
}

/*
 * The documents a rule may rest on, as ../shared/REFERENCES.md names them (and the
 * further ones the rules cite, each marked "from memory" there), plus PRODUCT.md's two
 * markers for a value with no published source: "common practice" and "from memory".
 * A case below cites its documents in `source`; the rule that fires must name exactly
 * the same documents and markers in its own declared source (rule.source, kept as data
 * in shared/triage/rules.ts), so a rule that changes its basis, or a case that cites
 * something the rule does not rest on, fails.
 */
const DOCUMENTS: Record<string, RegExp> = {
  'NICE NG234 (2023), spinal metastases and MSCC': /\bNG234\b/,
  'NICE CG151 (2012), neutropenic sepsis': /\bCG151\b/,
  'NICE NG51, sepsis': /\bNG51\b/,
  'NICE NG158, venous thromboembolism': /\bNG158\b/,
  'NICE NG232, head injury': /\bNG232\b/,
  'NICE CKS, headache': /\bNICE CKS\b/,
  'CTCAE v5.0 (NCI, 2017)': /\bCTCAE v5\.0\b/,
  'Serlin RC et al., Pain 1995': /\bSerlin\b/,
  'Barry MJ et al., J Urol 1992': /\bBarry\b[^;]*\b1992\b/,
  'Barry MJ et al., J Urol 1995': /\bBarry\b[^;]*\b1995\b/,
  'Kroenke K et al., Med Care 2003 (PHQ-2)': /\bKroenke\b/,
  'ADA Standards of Care 2025': /\bADA (?:Standards of Care )?2025\b/,
  'ADA Standards of Care 2025, section 2': /\bADA (?:Standards of Care )?2025,? section 2\b/,
  'ADA Standards of Care 2025, section 6': /\bADA (?:Standards of Care )?2025,? section 6\b/,
  'ADA hyperglycaemic crises consensus': /\bADA hyperglycaemic crises\b/,
  'GnRH-agonist depot prescribing information': /\bprescribing information\b/,
  'Basch E et al., J Clin Oncol 2016 / PRO-TECT JAMA 2022': /\bBasch\b/,
  'ESC syncope guidelines 2018': /\bESC (?:syncope guidelines )?2018\b/,
  'ESC heart failure guidelines 2021': /\bESC heart failure guidelines 2021\b/,
  'Wells criteria': /\bWells criteria\b/,
  'WAO 2020 anaphylaxis criteria': /\bWAO 2020\b/,
  'Tidewell issue 9 (every note is read)': /\bissue 9\b/,
  'common practice': /\bcommon practice\b/i,
  'from memory': /\bfrom memory\b/i,
}

/** The documents and markers a source text names, in table order. */
const documentsIn = (text: string) => Object.entries(DOCUMENTS).filter(([, pattern]) => pattern.test(text)).map(([name]) => name)

interface RuleCase {
  /** The documents this case's level rests on, written from REFERENCES.md (see DOCUMENTS). */
  source: string
  /**
   * Set where the rule's declared source does not name what the case cites: the source
   * check is then listed as a todo with this text, for the lead to decide (issue 16).
   */
  sourceDisagreement?: string
  level: TriageLevel
  fires: DiaryEntryInput
  misses: DiaryEntryInput
  context?: Partial<TriageContext>
  missContext?: Partial<TriageContext>
}

const rightNow = (item: keyof DiaryEntryInput['rightNow']): Change => (entry) => {
  entry.rightNow[item] = true
}

/*
 * Every rule in the two tables, with an entry that fires it and one that just misses it.
 * A test below fails if a rule is added to the tables without a case here.
 */
const CASES: Record<string, RuleCase> = {
  'right-now-weakness': {
    source: 'NICE NG234', level: 'emergency',
    fires: entryWith(rightNow('newWeakness')),
    misses: entryWith(painOf(3, 'legs'), tingling),
  },
  'right-now-numbness': {
    source: 'NICE NG234', level: 'emergency',
    fires: entryWith(rightNow('newNumbness')),
    misses: entryWith(tingling),
  },
  'right-now-walking': {
    source: 'NICE NG234', level: 'emergency',
    fires: entryWith(rightNow('troubleWalking')),
    misses: entryWith(painOf(5, 'legs')),
  },
  'right-now-bladder-bowel': {
    source: 'NICE NG234', level: 'emergency',
    fires: entryWith(rightNow('bladderBowelControl')),
    misses: entryWith(weakStream),
  },
  'right-now-cannot-pass-urine': {
    source: 'prescribing information Warnings; common practice', level: 'emergency',
    fires: entryWith(rightNow('cannotPassUrine')),
    misses: entryWith(weakStream),
  },
  'right-now-chest-pain': {
    source: 'common practice', level: 'emergency',
    fires: entryWith(rightNow('chestPain')),
    misses: entryWith(e => (e.heart.racingOrIrregular = true)),
  },
  'right-now-breathing': {
    source: 'common practice', level: 'emergency',
    fires: entryWith(rightNow('hardToBreathe')),
    misses: entryWith(e => (e.heart.breathlessLightEffort = true)),
  },
  'right-now-stroke-signs': {
    source: 'common practice', level: 'emergency',
    fires: entryWith(rightNow('faceDroopSpeech')),
    misses: entryWith(tingling),
  },
  'right-now-seizure': {
    source: 'common practice', level: 'emergency',
    fires: entryWith(rightNow('seizure')),
    misses: entryWith(e => (e.heart.fainting = true)),
  },
  'right-now-face-throat-swelling': {
    source: 'common practice (anaphylaxis)', level: 'emergency',
    fires: entryWith(rightNow('faceThroatSwelling')),
    misses: entryWith(e => (e.injectionSite.swelling = true)),
  },
  'right-now-self-harm': {
    source: 'Kroenke 2003; common practice', level: 'emergency',
    fires: entryWith(rightNow('selfHarmThoughts')),
    misses: entryWith(e => (e.mood = { phq2Interest: 3, phq2Down: 3 })),
  },
  'spinal-pain-pattern': {
    source: 'NICE NG234', level: 'urgent',
    fires: entryWith(painOf(3, 'back'), newOrWorse),
    misses: entryWith(painOf(3, 'back')),
  },
  'severe-pain-new-or-worse': {
    source: 'Serlin 1995 (7-10 severe); new or worse: common practice', level: 'urgent',
    fires: entryWith(painOf(7, 'hips'), newOrWorse),
    misses: entryWith(painOf(6, 'hips'), newOrWorse),
  },
  'blood-in-urine': {
    source: 'common practice', level: 'urgent',
    fires: entryWith(e => (e.urinary.blood = true)),
    misses: entryWith(e => (e.urinary.burning = true)),
  },
  'fainting': {
    source: 'common practice', level: 'urgent',
    fires: entryWith(e => (e.heart.fainting = true)),
    misses: entryWith(e => (e.heart.racingOrIrregular = true)),
  },
  'injection-site-infection': {
    source: 'common practice', level: 'urgent',
    fires: entryWith(e => (e.injectionSite.feverOrSpreadingRednessOrPus = true)),
    misses: entryWith(e => (e.injectionSite = { ...e.injectionSite, pain: true, redness: true, swelling: true })),
  },
  'glucose-very-high': {
    source: 'from memory: 300 mg/dL', level: 'urgent',
    fires: entryWith(glucose(300, 'mg/dL')),
    misses: entryWith(glucose(299, 'mg/dL')),
  },
  'hot-flushes-grade-3': {
    source: 'CTCAE v5.0', level: 'urgent',
    fires: entryWith(e => (e.hotFlushes = { perDay: 12, worstSeverity: 'severe', interference: 'self-care' })),
    misses: entryWith(e => (e.hotFlushes = { perDay: 12, worstSeverity: 'severe', interference: 'usual-activities' })),
  },
  'fatigue-grade-3': {
    source: 'CTCAE v5.0', level: 'urgent',
    fires: entryWith(e => (e.fatigue = 'limits-self-care')),
    misses: entryWith(e => (e.fatigue = 'limits-usual-activities')),
  },
  'ipss-severe': {
    source: 'Barry 1992', level: 'routine',
    fires: entryWith(ipssItems([3, 3, 3, 3, 3, 3, 2])),
    misses: entryWith(ipssItems([3, 3, 3, 3, 3, 2, 2])),
  },
  'phq2-positive': {
    source: 'Kroenke 2003', level: 'routine',
    fires: entryWith(e => (e.mood = { phq2Interest: 2, phq2Down: 1 })),
    misses: entryWith(e => (e.mood = { phq2Interest: 1, phq2Down: 1 })),
  },
  'high-sugar-symptoms': {
    source: 'ADA 2025; common practice', level: 'routine',
    fires: entryWith(e => (e.sugar.veryThirsty = true)),
    // A reading never lowers what the symptoms give (issue 9): no symptom, no rule.
    misses: entryWith(glucose(180, 'mg/dL')),
  },
  'hot-flushes-grade-2': {
    source: 'CTCAE v5.0', level: 'routine',
    fires: entryWith(e => (e.hotFlushes = { perDay: 6, worstSeverity: 'moderate', interference: 'usual-activities' })),
    misses: entryWith(e => (e.hotFlushes = { perDay: 10, worstSeverity: 'very-severe', interference: 'none' })),
  },
  'fatigue-grade-2': {
    source: 'CTCAE v5.0', level: 'routine',
    fires: entryWith(e => (e.fatigue = 'limits-usual-activities')),
    misses: entryWith(e => (e.fatigue = 'eased-by-rest')),
  },
  'injection-site-signs': {
    source: 'CTCAE v5.0 injection site reaction', level: 'routine',
    fires: entryWith(e => (e.injectionSite.lump = true)),
    misses: entryWith(),
  },
  'heart-racing-or-irregular': {
    source: 'prescribing information Warnings (QT prolongation); common practice', level: 'routine',
    fires: entryWith(e => (e.heart.racingOrIrregular = true)),
    misses: entryWith(e => (e.heart.fainting = true)),
  },
  'leg-swelling': {
    source: 'prescribing information Warnings (cardiovascular disease); common practice', level: 'routine',
    fires: entryWith(e => (e.heart.legSwelling = true)),
    misses: entryWith(e => (e.injectionSite.swelling = true)),
  },
  'breathless-light-effort': {
    source: 'prescribing information Warnings (cardiovascular disease); common practice', level: 'routine',
    fires: entryWith(e => (e.heart.breathlessLightEffort = true)),
    misses: entryWith(rightNow('hardToBreathe')),
  },
  'burning-urine': {
    source: 'common practice (possible urinary infection)', level: 'routine',
    fires: entryWith(e => (e.urinary.burning = true)),
    misses: entryWith(weakStream),
  },
  'note-to-read': {
    source: 'common practice: every note is read by a person (issue 9)', level: 'routine',
    fires: entryWith(e => (e.note = 'My legs gave way on the stairs last night')),
    misses: entryWith(e => (e.note = '  \n ')),
  },
  'baseline-pain': {
    source: 'Basch 2016 / PRO-TECT 2022: worse by 2 or more points since the last report (from memory)', level: 'routine',
    // Last report 2: 4 is 2 points up, 3 only 1.
    fires: entryWith(painOf(4, 'hips')),
    misses: entryWith(painOf(3, 'hips')),
    context: { baseline: [entryWith(painOf(2, 'hips'))] },
  },
  'baseline-hot-flushes': {
    source: 'Basch 2016: 2 grades since the last report, from memory', level: 'urgent',
    // Grade 0 to grade 2 (routine on its own) is raised to urgent; grade 1 is not 2 up.
    fires: entryWith(e => (e.hotFlushes = { perDay: 6, worstSeverity: 'moderate', interference: 'usual-activities' })),
    misses: entryWith(e => (e.hotFlushes = { perDay: 6, worstSeverity: 'moderate', interference: 'none' })),
    context: { baseline: steadyBaseline() },
  },
  'baseline-fatigue': {
    source: 'Basch 2016: 2 grades since the last report, from memory', level: 'urgent',
    fires: entryWith(e => (e.fatigue = 'limits-usual-activities')),
    misses: entryWith(e => (e.fatigue = 'limits-usual-activities')),
    context: { baseline: steadyBaseline() },
    missContext: { baseline: steadyBaseline(e => (e.fatigue = 'eased-by-rest')) },
  },
  'baseline-injection-site': {
    source: 'Basch 2016: 2 grades since the last report, from memory', level: 'urgent',
    fires: entryWith(e => (e.injectionSite.pain = true)),
    misses: entryWith(e => (e.injectionSite.redness = true)),
    context: { baseline: steadyBaseline() },
  },
  'flare-watch-bone-pain': {
    source: 'prescribing information Warnings (tumour flare); NICE NG234; common practice', level: 'urgent',
    fires: entryWith(painOf(4, 'hips'), newOrWorse),
    misses: entryWith(painOf(3, 'hips'), newOrWorse),
    context: { flareWatchActive: true },
  },
  'flare-watch-urinary': {
    // REFERENCES.md, flare: urinary obstruction in the flare is the prescribing information's
    // warning (common practice); NG234 is about spinal cord compression, not a weak stream.
    source: 'prescribing information Warnings (tumour flare, urinary obstruction); common practice',
    level: 'urgent',
    fires: entryWith(weakStream),
    misses: entryWith(weakStream),
    context: { flareWatchActive: true },
    missContext: { flareWatchActive: false },
  },
  'flare-watch-tingling': {
    source: 'prescribing information Warnings (tumour flare); NICE NG234; common practice', level: 'urgent',
    fires: entryWith(tingling),
    misses: entryWith(tingling, weakStream),
    context: { flareWatchActive: true },
    missContext: { flareWatchActive: false },
  },
  'spinal-pain-neurological': {
    source: 'NICE NG234: spinal pain with numbness or sensory loss is seen at once', level: 'emergency',
    fires: entryWith(painOf(2, 'back'), tingling),
    misses: entryWith(painOf(2, 'hips'), tingling),
  },
  'fever-during-chemotherapy': {
    source: 'NICE CG151: 38 °C or more during chemotherapy (wording from memory)', level: 'emergency',
    fires: entryWith(temperature(38.0)),
    misses: entryWith(temperature(37.9)),
    context: risk('chemotherapy'),
  },
  'fainting-with-heart-signs': {
    source: 'ESC syncope guidelines 2018 (high-risk features), from memory', level: 'emergency',
    fires: entryWith(heart('fainting', 'racingOrIrregular')),
    misses: entryWith(heart('fainting', 'oneLegPainfulSwollen')),
  },
  'possible-lung-clot': {
    source: 'common practice; Wells criteria, NICE NG158, from memory (possible pulmonary embolism)', level: 'emergency',
    fires: entryWith(heart('oneLegPainfulSwollen', 'racingOrIrregular')),
    misses: entryWith(heart('oneLegPainfulSwollen', 'legSwelling')),
  },
  'black-stool-with-fainting': {
    source: 'common practice (bleeding with collapse)', level: 'emergency',
    fires: entryWith(bowel({ bloodOrBlackStool: true }), heart('fainting')),
    misses: entryWith(bowel({ bloodOrBlackStool: true }), heart('racingOrIrregular')),
  },
  'constipation-with-vomiting': {
    source: 'common practice (possible bowel obstruction)', level: 'emergency',
    fires: entryWith(bowel({ constipation: 'no-movement-despite-laxatives', vomiting: true })),
    misses: entryWith(bowel({ constipation: 'persistent', vomiting: true })),
  },
  'head-injury-with-confusion': {
    source: 'NICE NG232 head injury, from memory; common practice', level: 'emergency',
    fires: entryWith(yes('falls'), yes('falls', 'hitHeadOrHurt'), yes('mind')),
    misses: entryWith(yes('falls'), yes('falls', 'hitHeadOrHurt'), yes('mind', 'memoryOrConcentration')),
  },
  'rash-with-fainting': {
    source: 'WAO 2020 anaphylaxis criteria, from memory; prescribing information (hypersensitivity)', level: 'emergency',
    fires: entryWith(yes('allergy'), heart('fainting')),
    misses: entryWith(yes('allergy'), heart('racingOrIrregular')),
  },
  'low-sugar-with-confusion': {
    source: 'ADA 2025 section 6: level 3 (altered mental state); common practice', level: 'emergency',
    fires: entryWith(glucose(69, 'mg/dL'), yes('mind', 'confusedOrHardToWake')),
    misses: entryWith(glucose(70, 'mg/dL'), yes('mind', 'confusedOrHardToWake')),
  },
  'high-sugar-with-confusion': {
    source: 'ADA hyperglycaemic crises consensus, from memory; common practice', level: 'emergency',
    fires: entryWith(glucose(16.7, 'mmol/L'), yes('mind')),
    misses: entryWith(glucose(16.6, 'mmol/L'), yes('mind')),
  },
  'spinal-pain-worse-since-last': {
    source: 'NICE NG234 (progressive spinal pain); Basch: 2 points since the last report, from memory', level: 'urgent',
    fires: entryWith(painOf(4, 'neck')),
    misses: entryWith(painOf(4, 'hips')),
    context: { baseline: [entryWith(painOf(2, 'neck'))] },
  },
  'pain-with-tingling': {
    source: 'NICE NG234 (radicular pain with sensory change); common practice', level: 'urgent',
    fires: entryWith(painOf(1, 'legs'), tingling),
    misses: entryWith(painOf(0), tingling),
  },
  'fever-high': {
    source: 'CTCAE v5.0 fever grade 2 (above 39.0 °C); common practice', level: 'urgent',
    fires: entryWith(temperature(39.1)),
    misses: entryWith(temperature(39.0)),
  },
  'diarrhoea-with-vomiting': {
    source: 'common practice (dehydration)', level: 'urgent',
    fires: entryWith(bowel({ extraStoolsPerDay: 4, vomiting: true })),
    misses: entryWith(bowel({ extraStoolsPerDay: 3, vomiting: true })),
  },
  'glucose-high': {
    source: 'ADA 2025 section 2: 200 mg/dL or more suggests diabetes; prescribing information Warnings (hyperglycaemia)', level: 'routine',
    fires: entryWith(glucose(200, 'mg/dL')),
    misses: entryWith(glucose(199, 'mg/dL')),
  },
  'baseline-mood': {
    source: 'Basch 2016: 2 points since the last report, from memory; PHQ-2 (Kroenke 2003)',
    level: 'routine',
    fires: entryWith(e => (e.mood = { phq2Interest: 1, phq2Down: 1 })),
    misses: entryWith(e => (e.mood = { phq2Interest: 1, phq2Down: 1 })),
    context: { baseline: [entryWith()] },
    missContext: { baseline: [entryWith(e => (e.mood = { phq2Interest: 1, phq2Down: 0 }))] },
  },
  'baseline-ipss': {
    source: 'Barry 1995: about 3 IPSS points is a noticed change, from memory; common practice', level: 'routine',
    // IPSS 5 last month, 8 now (moderate, not severe): 3 points up; 7 is only 2.
    fires: entryWith(ipssItems([2, 2, 1, 1, 1, 1, 0])),
    misses: entryWith(ipssItems([2, 2, 1, 1, 1, 0, 0])),
    context: { baseline: [entryWith(), entryWith(ipssItems([1, 1, 1, 1, 1, 0, 0]))] },
  },
  'headache-vision-or-vomiting': {
    source: 'prescribing information (pituitary apoplexy), from memory; common practice', level: 'emergency',
    fires: entryWith(yes('headache'), bowel({ vomiting: true })),
    misses: entryWith(yes('headache'), yes('headache', 'suddenSevere')),
  },
  'heart-signs-together': {
    source: 'ESC heart failure guidelines 2021, from memory; same-day call: common practice', level: 'urgent',
    fires: entryWith(heart('legSwelling', 'breathlessLightEffort')),
    misses: entryWith(heart('legSwelling', 'oneLegPainfulSwollen')),
  },
  'one-leg-painful-swollen': {
    source: 'common practice, from memory (possible DVT)', level: 'urgent',
    fires: entryWith(heart('oneLegPainfulSwollen')),
    misses: entryWith(heart('legSwelling')),
  },
  'glucose-very-low': {
    source: 'ADA 2025 section 6: level 2 below 54 mg/dL; same-day call: common practice', level: 'urgent',
    fires: entryWith(glucose(53, 'mg/dL')),
    misses: entryWith(glucose(54, 'mg/dL')),
  },
  'low-sugar-needed-help': {
    source: 'ADA 2025 section 6: level 3; same-day call: common practice', level: 'urgent',
    fires: entryWith(e => (e.sugar.neededHelpForLowSugar = true)),
    misses: entryWith(e => (e.sugar.lowSugarSigns = true)),
  },
  'fever-with-warning-signs': {
    source: 'REFERENCES.md fever during cancer treatment: common practice', level: 'urgent',
    fires: entryWith(temperature(100.4, '°F'), yes('infection', 'shakingChills')),
    misses: entryWith(temperature(100.3, '°F'), yes('infection', 'shakingChills')),
  },
  'diarrhoea-grade-3': {
    source: 'CTCAE v5.0 diarrhoea grade 3 (7 or more over baseline)', level: 'urgent',
    fires: entryWith(bowel({ extraStoolsPerDay: 7 })),
    misses: entryWith(bowel({ extraStoolsPerDay: 6 })),
  },
  'constipation-no-movement': {
    source: 'CTCAE v5.0 constipation grade 3; same-day call: common practice', level: 'urgent',
    fires: entryWith(bowel({ constipation: 'no-movement-despite-laxatives' })),
    misses: entryWith(bowel({ constipation: 'persistent' })),
  },
  'blood-or-black-stool': {
    source: 'common practice (possible gut bleeding)', level: 'urgent',
    fires: entryWith(bowel({ bloodOrBlackStool: true })),
    misses: entryWith(e => (e.urinary.blood = true)),
  },
  'vomiting-with-confusion': {
    source: 'common practice (possible hypercalcaemia)', level: 'urgent',
    fires: entryWith(bowel({ vomiting: true }), yes('mind', 'confusedOrHardToWake')),
    misses: entryWith(bowel({ vomiting: true }), yes('mind', 'memoryOrConcentration')),
  },
  'fall-injury': {
    source: 'prescribing information Warnings (bone loss); common practice (possible fracture)',
    level: 'urgent',
    fires: entryWith(yes('falls'), yes('falls', 'cannotBearWeight')),
    misses: entryWith(yes('falls')),
  },
  'rash-spreading': {
    source: 'prescribing information (hypersensitivity); common practice', level: 'urgent',
    fires: entryWith(yes('allergy'), yes('allergy', 'spreading')),
    misses: entryWith(yes('allergy')),
  },
  'confused-or-hard-to-wake': {
    source: 'common practice (delirium)', level: 'urgent',
    fires: entryWith(yes('mind', 'confusedOrHardToWake')),
    misses: entryWith(yes('mind', 'memoryOrConcentration')),
  },
  'headache-sudden-severe': {
    source: 'common practice: thunderclap headache (NICE CKS red flags, from memory); prescribing information (pituitary apoplexy), from memory', level: 'emergency',
    fires: entryWith(yes('headache'), yes('headache', 'suddenSevere')),
    misses: entryWith(yes('headache')),
  },
  'severe-pain': {
    source: 'Serlin 1995 (7-10 severe), whether or not new: common practice', level: 'routine',
    fires: entryWith(painOf(7, 'hips')),
    misses: entryWith(painOf(6, 'hips')),
  },
  'pain-night-or-straining': {
    source: 'NICE NG234 features; common practice outside the spine', level: 'routine',
    fires: entryWith(painOf(3, 'hips'), e => (e.pain.wakesAtNight = true)),
    misses: entryWith(painOf(3, 'hips'), newOrWorse),
  },
  'tingling-or-numbness': {
    source: 'common practice; with spinal pain NICE NG234', level: 'routine',
    fires: entryWith(tingling),
    misses: entryWith(painOf(3, 'legs')),
  },
  'weak-stream': {
    source: 'prescribing information Warnings (urinary obstruction); common practice', level: 'routine',
    fires: entryWith(weakStream),
    misses: entryWith(e => (e.urinary.burning = true)),
  },
  'glucose-high-with-symptoms': {
    source: 'ADA 2025 section 2: 200 mg/dL or more with symptoms', level: 'routine',
    fires: entryWith(glucose(200, 'mg/dL'), e => (e.sugar.urinatingMore = true)),
    misses: entryWith(glucose(199, 'mg/dL'), e => (e.sugar.urinatingMore = true)),
  },
  'glucose-low': {
    source: 'ADA 2025 section 6: level 1 below 70 mg/dL', level: 'routine',
    fires: entryWith(glucose(69, 'mg/dL')),
    misses: entryWith(glucose(70, 'mg/dL')),
  },
  'low-sugar-signs': {
    source: 'ADA 2025 section 6 (symptoms); common practice', level: 'routine',
    fires: entryWith(e => (e.sugar.lowSugarSigns = true)),
    misses: entryWith(e => (e.sugar.veryThirsty = false)),
  },
  'infection-signs': {
    source: 'common practice', level: 'routine',
    fires: entryWith(yes('infection')),
    misses: entryWith(e => (e.hotFlushes.perDay = 3)),
  },
  'fever': {
    source: 'CTCAE v5.0 fever grade 1 from 38.0 °C; routine review: common practice', level: 'routine',
    fires: entryWith(temperature(38.0)),
    misses: entryWith(temperature(37.9)),
  },
  'temperature-low': {
    source: 'NICE NG51 (below 36 °C), from memory; routine review: common practice', level: 'routine',
    fires: entryWith(temperature(35.9)),
    misses: entryWith(temperature(36.0)),
  },
  'diarrhoea-grade-2': {
    source: 'CTCAE v5.0 diarrhoea grade 2 (4-6 over baseline)', level: 'routine',
    fires: entryWith(bowel({ extraStoolsPerDay: 4 })),
    misses: entryWith(bowel({ extraStoolsPerDay: 3 })),
  },
  'constipation-persistent': {
    source: 'CTCAE v5.0 constipation grade 2', level: 'routine',
    fires: entryWith(bowel({ constipation: 'persistent' })),
    misses: entryWith(bowel({ constipation: 'occasional' })),
  },
  'vomiting': {
    source: 'common practice', level: 'routine',
    fires: entryWith(bowel({ vomiting: true })),
    misses: entryWith(bowel({})),
  },
  'fall': {
    source: 'prescribing information Warnings (bone mineral density); common practice', level: 'routine',
    fires: entryWith(yes('falls')),
    misses: entryWith(),
  },
  'rash-after-injection': {
    source: 'prescribing information (hypersensitivity, injection-site reactions); routine review: common practice', level: 'routine',
    fires: entryWith(yes('allergy')),
    misses: entryWith(e => (e.injectionSite.redness = true)),
  },
  'mind-changes': {
    source: 'prescribing information adverse reactions, from memory; common practice', level: 'routine',
    fires: entryWith(yes('mind', 'memoryOrConcentration')),
    misses: entryWith(e => (e.fatigue = 'eased-by-rest')),
  },
  'headache-new': {
    source: 'common practice', level: 'routine',
    fires: entryWith(yes('headache')),
    misses: entryWith(),
  },
  'baseline-diarrhoea': {
    source: 'Basch 2016: 2 grades since the last report, from memory', level: 'urgent',
    // Last report grade 0; 4 extra stools is grade 2 (routine), raised to urgent; 3 extra is grade 1.
    fires: entryWith(bowel({ extraStoolsPerDay: 4 })),
    misses: entryWith(bowel({ extraStoolsPerDay: 3 })),
    context: { baseline: [entryWith()] },
  },
  'baseline-constipation': {
    source: 'Basch 2016: 2 grades since the last report, from memory', level: 'urgent',
    fires: entryWith(bowel({ constipation: 'persistent' })),
    misses: entryWith(bowel({ constipation: 'persistent' })),
    context: { baseline: [entryWith(bowel({ constipation: 'none' }))] },
    missContext: { baseline: [entryWith(bowel({ constipation: 'occasional' }))] },
  },
  'flare-watch-mild-bone-pain': {
    source: 'prescribing information Warnings (tumour flare); NICE NG234; common practice', level: 'routine',
    fires: entryWith(painOf(1, 'ribs'), newOrWorse),
    misses: entryWith(painOf(1, 'ribs')),
    context: { flareWatchActive: true },
  },
  'risk-spinal-metastases': {
    source: 'prescribing information Warnings (vertebral metastases); NICE NG234', level: 'urgent',
    fires: entryWith(tingling),
    misses: entryWith(e => (e.urinary.burning = true)),
    context: risk('spinalMetastases'),
  },
  'risk-urinary-obstruction': {
    source: 'prescribing information Warnings (urinary obstruction)', level: 'urgent',
    fires: entryWith(weakStream),
    misses: entryWith(tingling),
    context: risk('urinaryObstruction'),
  },
  'risk-diabetes': {
    source: 'prescribing information Warnings (hyperglycaemia); ADA 2025; at most same-day: common practice', level: 'urgent',
    fires: entryWith(glucose(65, 'mg/dL')),
    misses: entryWith(glucose(65, 'mg/dL')),
    missContext: risk('heartDisease'),
    context: risk('diabetes'),
  },
  'risk-heart-disease': {
    source: 'prescribing information Warnings (cardiovascular disease); ESC 2018, from memory', level: 'emergency',
    fires: entryWith(heart('fainting')),
    misses: entryWith(heart('oneLegPainfulSwollen')),
    context: risk('heartDisease'),
  },
  'risk-long-qt': {
    source: 'prescribing information Warnings (QT prolongation), from memory', level: 'urgent',
    fires: entryWith(heart('racingOrIrregular')),
    misses: entryWith(heart('legSwelling')),
    context: risk('longQt'),
  },
  'risk-seizures': {
    source: 'prescribing information (convulsions), from memory; common practice', level: 'emergency',
    fires: entryWith(yes('mind', 'confusedOrHardToWake')),
    misses: entryWith(heart('fainting')),
    context: risk('seizures'),
  },
  'risk-chemotherapy': {
    source: 'NICE CG151 (wording from memory); diarrhoea or vomiting during chemotherapy: common practice', level: 'urgent',
    // A yes to "fever or chills this week" with no reading: routine, raised to urgent.
    fires: entryWith(yes('infection')),
    misses: entryWith(e => (e.injectionSite.redness = true)),
    context: risk('chemotherapy'),
  },
}

const ALL_RULES = [...TRIAGE_RULES, ...RAISE_RULES]

describe('the rule tables', () => {
  it('every rule has a firing case and a near-miss case below', () => {
    expect(Object.keys(CASES).sort()).toEqual(ALL_RULES.map(rule => rule.id).sort())
  })

  it('ids are unique and each rule names its locale keys', () => {
    expect(new Set(ALL_RULES.map(rule => rule.id)).size).toBe(ALL_RULES.length)
    for (const rule of ALL_RULES) {
      expect(rule.reasonKey).toBe(`triage.rules.${rule.id}.reason`)
      expect(rule.instructionKey).toBe(`triage.rules.${rule.id}.instruction`)
    }
  })

  it('each rule names a published document of the table, or says common practice or from memory (PRODUCT.md, sources)', () => {
    const unsourced = ALL_RULES.filter(rule => documentsIn(rule.source).length === 0).map(rule => `${rule.id}: "${rule.source}"`)
    expect(unsourced).toEqual([])
  })

  it('only glucose-very-high rests on a value from memory with no document and no common practice named', () => {
    // The 300 mg/dL threshold is recalled, and REFERENCES.md lists no document for it (reported in issue 16).
    const memoryOnly = ALL_RULES.filter(rule => documentsIn(rule.source).join() === 'from memory').map(rule => rule.id)
    expect(memoryOnly).toEqual(['glucose-very-high'])
  })

  it('raise rules point at fixed rules that exist', () => {
    const fixedIds = TRIAGE_RULES.map(rule => rule.id)
    for (const rule of RAISE_RULES) {
      for (const id of rule.symptomRules) expect(fixedIds, rule.id).toContain(id)
    }
  })

  it('baseline raises stop at urgent; flare-watch raises start at urgent, but mild new pain at routine', () => {
    for (const rule of RAISE_RULES) {
      if (rule.raisedBy === 'baseline') expect(rule, rule.id).toMatchObject({ atLeast: 'routine', atMost: 'urgent' })
      else if (rule.id === 'flare-watch-mild-bone-pain') expect(rule).toMatchObject({ atLeast: 'routine', atMost: 'urgent' })
      else if (rule.raisedBy === 'flare-watch') expect(rule, rule.id).toMatchObject({ atLeast: 'urgent', atMost: 'emergency' })
    }
  })

  it('each risk raise names its factor; sugar findings go no higher than urgent, the others up to emergency', () => {
    const risks = RAISE_RULES.filter(rule => rule.raisedBy === 'risk')
    expect(risks.map(rule => rule.riskFactor).sort()).toEqual(
      ['chemotherapy', 'diabetes', 'heartDisease', 'longQt', 'seizures', 'spinalMetastases', 'urinaryObstruction'])
    for (const rule of risks) {
      expect(rule.atMost, rule.id).toBe(rule.riskFactor === 'diabetes' ? 'urgent' : 'emergency')
      expect(rule.symptomRules.length, rule.id).toBeGreaterThan(0)
    }
  })
})

describe.each(Object.entries(CASES))('rule %s', (id, ruleCase) => {
  it(`fires at ${ruleCase.level} (${ruleCase.source})`, () => {
    const result = triage(ruleCase.fires, ruleCase.context)
    const reason = result.reasons.find(r => r.rule === id)
    expect(reason).toBeDefined()
    expect(reason?.level).toBe(ruleCase.level)
    expect(compareLevels(result.level, ruleCase.level)).toBeGreaterThanOrEqual(0)
    expect(documentsIn(ruleCase.source), `${id}: the case cites no document of the table`).not.toEqual([])
  })

  if (ruleCase.sourceDisagreement) {
    it.todo(`names the documents the case cites (${ruleCase.source}): DISAGREES, ${ruleCase.sourceDisagreement}`)
  }
  else {
    it(`names the documents the case cites (${ruleCase.source})`, () => {
      // The rule that fired rests on the documents this case cites, no more and no fewer.
      const reason = triage(ruleCase.fires, ruleCase.context).reasons.find(r => r.rule === id)
      expect(reason, `${id} did not fire`).toBeDefined()
      expect(documentsIn(reason!.source), `${id}: the rule's source is "${reason!.source}"`).toEqual(documentsIn(ruleCase.source))
    })
  }

  it('just misses', () => {
    expect(firedRules(ruleCase.misses, ruleCase.missContext ?? ruleCase.context)).not.toContain(id)
  })
})

describe('rules version', () => {
  it('is tidewell-triage-3 (issue 9), stored with every result', () => {
    expect(RULES_VERSION).toBe('tidewell-triage-3')
    expect(triage(emptyDiaryEntry()).rulesVersion).toBe('tidewell-triage-3')
  })
})

describe('levels', () => {
  it('are ordered none < routine < urgent < emergency', () => {
    expect(LEVELS).toEqual(['none', 'routine', 'urgent', 'emergency'])
    expect(compareLevels('emergency', 'urgent')).toBeGreaterThan(0)
    expect(compareLevels('routine', 'urgent')).toBeLessThan(0)
    expect(compareLevels('none', 'none')).toBe(0)
  })

  it('an entry with nothing to report is none, with no response needed', () => {
    expect(triage(emptyDiaryEntry())).toEqual({
      level: 'none',
      instructionKey: 'triage.levelInstructions.none',
      reasons: [],
      respondBy: null,
      noteFlagged: false,
      rulesVersion: RULES_VERSION,
    })
  })

  it('the highest level wins and every reason is kept, highest first', () => {
    const entry = entryWith(
      e => (e.mood = { phq2Interest: 2, phq2Down: 2 }),
      e => (e.urinary.blood = true),
      rightNow('chestPain'),
      e => (e.fatigue = 'limits-usual-activities'),
    )
    const result = triage(entry)
    expect(result.level).toBe('emergency')
    expect(result.reasons.map(r => [r.rule, r.level])).toEqual([
      ['right-now-chest-pain', 'emergency'],
      ['blood-in-urine', 'urgent'],
      ['phq2-positive', 'routine'],
      ['fatigue-grade-2', 'routine'],
    ])
  })
})

describe('spinal metastasis pain pattern (NICE NG234)', () => {
  it.each([
    ['new back pain', [painOf(2, 'back'), newOrWorse]],
    ['neck pain that wakes him at night', [painOf(4, 'neck'), (e: DiaryEntryInput) => (e.pain.wakesAtNight = true)]],
    ['back pain worse on straining', [painOf(4, 'back'), (e: DiaryEntryInput) => (e.pain.worseOnStraining = true)]],
    ['band-like pain round the ribs', [painOf(4, 'ribs'), (e: DiaryEntryInput) => (e.pain.bandLike = true)]],
  ] as [string, Change[]][])('%s is urgent', (_label, changes) => {
    const result = triage(entryWith(...changes))
    expect(result.level).toBe('urgent')
    expect(result.reasons.map(r => r.rule)).toContain('spinal-pain-pattern')
  })

  it('night pain or straining in the hips alone is not the spinal pattern', () => {
    const entry = entryWith(painOf(4, 'hips'), e => (e.pain.wakesAtNight = true), e => (e.pain.worseOnStraining = true))
    expect(firedRules(entry)).not.toContain('spinal-pain-pattern')
  })
})

describe('home glucose at or above 300 mg/dL (16.7 mmol/L; from memory), units converted', () => {
  it('16.7 mmol/L (x 18.016 = 300.9 mg/dL) fires; 16.6 (299.1 mg/dL) does not', () => {
    expect(firedRules(entryWith(glucose(16.7, 'mmol/L')))).toContain('glucose-very-high')
    expect(firedRules(entryWith(glucose(16.6, 'mmol/L')))).not.toContain('glucose-very-high')
  })
})

describe('IPSS severe needs the IPSS answers (Barry 1992)', () => {
  it('does not fire when the month\'s IPSS was not asked', () => {
    expect(firedRules(entryWith(weakStream))).not.toContain('ipss-severe')
  })
})

describe('worse than his last report (Basch 2016 and PRO-TECT 2022: worse by 2 or more since the last report, from memory)', () => {
  // REFERENCES.md: the trials alerted on "worse by 2 or more points since the last report".
  // Pain counts NRS points (0-10); graded symptoms count CTCAE grades.
  it('uses his last report only (the first of the previous entries, most recent first)', () => {
    const previous = [8, 1, 1, 1].map(worst => entryWith(painOf(worst, 'hips')))
    expect(baselineOf(previous)?.pain).toBe(8)
    expect(firedRules(entryWith(painOf(5, 'hips')), { baseline: previous })).not.toContain('baseline-pain')
    expect(firedRules(entryWith(painOf(5, 'hips')), { baseline: previous.slice(1) })).toContain('baseline-pain')
  })

  it('reads an entry stored before rules version 3 (no bowel section) as no bowel change', () => {
    const old = entryWith(painOf(2, 'hips')) as Partial<DiaryEntryInput>
    delete old.bowel
    delete old.infection
    const baseline = baselineOf([old as DiaryEntryInput])
    expect(baseline).toMatchObject({ pain: 2, diarrhoea: 0, constipation: 0 })
    expect(triage(entryWith(bowel({ extraStoolsPerDay: 4 })), { baseline: [old as DiaryEntryInput] }).level).toBe('urgent')
  })

  it('has no baseline before his first entry', () => {
    expect(baselineOf([])).toBeNull()
    expect(triage(entryWith(painOf(6, 'hips'))).level).toBe('none')
  })

  it('raises one step: pain 2 -> 5 in the hips goes from none to routine, marked as baseline', () => {
    const result = triage(entryWith(painOf(5, 'hips')), { baseline: [entryWith(painOf(2, 'hips'))] })
    expect(result.level).toBe('routine')
    expect(result.reasons).toEqual([expect.objectContaining({ rule: 'baseline-pain', level: 'routine', raisedBy: 'baseline' })])
  })

  it('raises at most to urgent: pain 1 -> 9 new in the hips stays urgent', () => {
    const result = triage(entryWith(painOf(9, 'hips'), newOrWorse), { baseline: steadyBaseline(painOf(1, 'hips')) })
    expect(result.level).toBe('urgent')
    expect(result.reasons.find(r => r.rule === 'baseline-pain')?.level).toBe('urgent')
  })

  it('never ranks a symptom lower than its own rule: spinal pain with tingling stays emergency', () => {
    const result = triage(entryWith(painOf(6, 'back'), tingling), { baseline: [entryWith(painOf(1, 'back'))] })
    expect(result.level).toBe('emergency')
    expect(result.reasons.find(r => r.rule === 'baseline-pain')?.level).toBe('emergency')
  })

  it('raises the worsened symptom, not an unrelated finding beside it', () => {
    const entry = entryWith(painOf(5, 'hips'), e => (e.mood = { phq2Interest: 2, phq2Down: 2 }))
    const result = triage(entry, { baseline: steadyBaseline(painOf(2, 'hips'), e => (e.mood = { phq2Interest: 2, phq2Down: 2 })) })
    expect(result.level).toBe('routine')
  })

  it('does not fire on a steady high level', () => {
    const steady = steadyBaseline(e => (e.fatigue = 'limits-usual-activities'))
    const result = triage(entryWith(e => (e.fatigue = 'limits-usual-activities')), { baseline: steady })
    expect(result.level).toBe('routine')
    expect(result.reasons.map(r => r.rule)).toEqual(['fatigue-grade-2'])
  })
})

describe('flare watch (prescribing information, Warnings; NICE NG234; common practice)', () => {
  const firstInjection = '2025-01-06'
  const lastDay = addDays(firstInjection, 27)
  const contextOn = (today: string) => ({ flareWatchActive: flareWatch(firstInjection, today).active })

  it('raises new bone pain of 4 on the last day of the watch, and not on the day after', () => {
    const entry = entryWith(painOf(4, 'hips'), newOrWorse)
    const onLastDay = triage(entry, contextOn(lastDay))
    expect(onLastDay.level).toBe('urgent')
    expect(onLastDay.reasons).toEqual([
      expect.objectContaining({ rule: 'flare-watch-bone-pain', level: 'urgent', raisedBy: 'flare-watch' }),
      expect.objectContaining({ rule: 'flare-watch-mild-bone-pain', level: 'routine', raisedBy: 'flare-watch' }),
    ])
    const dayAfter = triage(entry, contextOn(addDays(lastDay, 1)))
    expect(dayAfter.level).toBe('none')
    expect(dayAfter.reasons).toEqual([])
  })

  it('counts pain in any place, "other" too, as possible bone pain', () => {
    // The diary's places leave out the pelvis, shoulders, skull and breastbone, common sites
    // of bone metastases (common practice); and one more place ticked must never lower the
    // level (the monotone property), which "no place counts, other does not" would break.
    expect(firedRules(entryWith(painOf(5), newOrWorse), { flareWatchActive: true })).toContain('flare-watch-bone-pain')
    expect(firedRules(entryWith(painOf(5, 'other'), newOrWorse), { flareWatchActive: true })).toContain('flare-watch-bone-pain')
  })

  it('mild new bone pain (1-3) is routine in the watch, none outside it (issue 9)', () => {
    const entry = entryWith(painOf(2, 'hips'), newOrWorse)
    expect(triage(entry, { flareWatchActive: true }).level).toBe('routine')
    expect(triage(entry).level).toBe('none')
    expect(triage(entryWith(painOf(2), newOrWorse), { flareWatchActive: true }).level).toBe('routine')
  })

  it('raises any urinary difficulty or tingling to at least urgent on the first day', () => {
    expect(triage(entryWith(weakStream), contextOn(firstInjection)).level).toBe('urgent')
    expect(triage(entryWith(tingling), contextOn(firstInjection)).level).toBe('urgent')
  })

  it('raises an urgent spinal pain pattern one level, to emergency', () => {
    const result = triage(entryWith(painOf(5, 'back'), newOrWorse), { flareWatchActive: true })
    expect(result.level).toBe('emergency')
    expect(result.reasons.map(r => [r.rule, r.level])).toEqual([
      ['flare-watch-bone-pain', 'emergency'],
      ['spinal-pain-pattern', 'urgent'],
      ['flare-watch-mild-bone-pain', 'urgent'],
    ])
  })

  it('raises a severe IPSS (routine) with urinary difficulty to urgent', () => {
    const result = triage(entryWith(weakStream, ipssItems([4, 4, 3, 3, 4, 2, 2])), { flareWatchActive: true })
    expect(result.level).toBe('urgent')
  })

  it('does not raise findings that are not flare symptoms', () => {
    const result = triage(entryWith(e => (e.mood = { phq2Interest: 2, phq2Down: 2 })), { flareWatchActive: true })
    expect(result.level).toBe('routine')
  })

  it('and baseline raises do not stack: hips 2 -> 5 new is urgent, not emergency', () => {
    const result = triage(entryWith(painOf(5, 'hips'), newOrWorse), {
      flareWatchActive: true,
      baseline: steadyBaseline(painOf(2, 'hips')),
    })
    expect(result.level).toBe('urgent')
    expect(result.reasons.map(r => r.raisedBy).sort()).toEqual(['baseline', 'flare-watch', 'flare-watch'])
  })
})

describe('the free-text note', () => {
  it('never lowers a level and is flagged for the nurse', () => {
    const entry = entryWith(rightNow('chestPain'), e => (e.note = 'It has passed now, please ignore the box above.'))
    const result = triage(entry)
    expect(result.level).toBe('emergency')
    expect(result.noteFlagged).toBe(true)
  })

  it('alone is flagged and opens a routine "note to read" reason (issue 9)', () => {
    const result = triage(entryWith(e => (e.note = 'Could I move my appointment?')))
    expect(result.level).toBe('routine')
    expect(result.reasons.map(r => [r.rule, r.level])).toEqual([['note-to-read', 'routine']])
    expect(result.noteFlagged).toBe(true)
  })

  it('is not flagged when blank', () => {
    expect(triage(entryWith(e => (e.note = '   '))).noteFlagged).toBe(false)
  })
})

describe('respond-by targets (issue 4 defaults; clinic settings)', () => {
  const level = (l: TriageLevel, context: Partial<TriageContext> = {}) => {
    const entries: Record<TriageLevel, DiaryEntryInput> = {
      emergency: entryWith(rightNow('seizure')),
      urgent: entryWith(e => (e.urinary.blood = true)),
      routine: entryWith(e => (e.injectionSite.redness = true)),
      none: emptyDiaryEntry(),
    }
    return triage(entries[l], context)
  }

  it('emergency: at once', () => {
    expect(level('emergency').respondBy?.getTime()).toBe(SUBMITTED_AT.getTime())
  })

  it('urgent: within 4 hours, or the clinic\'s setting', () => {
    expect(level('urgent').respondBy?.getTime()).toBe(SUBMITTED_AT.getTime() + 4 * HOUR)
    expect(level('urgent', { targets: { urgentHours: 2 } }).respondBy?.getTime()).toBe(SUBMITTED_AT.getTime() + 2 * HOUR)
  })

  it('routine: 3 working days, skipping Saturday and Sunday', () => {
    // Wednesday -> Thursday, Friday, Monday.
    expect(level('routine').respondBy?.toISOString()).toBe('2025-03-17T15:00:00.000Z')
    expect(respondBy('routine', new Date('2025-03-14T15:00:00Z'))?.toISOString()).toBe('2025-03-19T15:00:00.000Z')
    expect(respondBy('routine', new Date('2025-03-15T15:00:00Z'))?.toISOString()).toBe('2025-03-19T15:00:00.000Z')
    expect(respondBy('routine', new Date('2025-03-16T15:00:00Z'))?.toISOString()).toBe('2025-03-19T15:00:00.000Z')
    expect(respondBy('routine', SUBMITTED_AT, { routineWorkingDays: 1 })?.toISOString()).toBe('2025-03-13T15:00:00.000Z')
  })

  it('routine counts working days in the clinic\'s time zone, across the spring change', () => {
    // Friday 2025-03-07 21:00 CST is already Saturday 03:00 in UTC.
    const fridayEvening = new Date('2025-03-08T03:00:00Z')
    // In Chicago: Monday, Tuesday, Wednesday 2025-03-12 at 21:00 CDT (UTC-5) = 02:00 UTC on the 13th.
    expect(respondBy('routine', fridayEvening, {}, 'America/Chicago')?.toISOString()).toBe('2025-03-13T02:00:00.000Z')
    // Counted in UTC from Saturday it would be Wednesday 03:00 UTC.
    expect(respondBy('routine', fridayEvening)?.toISOString()).toBe('2025-03-12T03:00:00.000Z')
    expect(level('routine', { timeZone: 'America/Chicago' }).respondBy?.toISOString()).toBe('2025-03-17T15:00:00.000Z')
  })

  it('none: no response', () => {
    expect(level('none').respondBy).toBeNull()
  })
})

describe('rightNowTriggered (the page shows emergency instructions at once)', () => {
  it('is quiet when every answer is no', () => {
    expect(rightNowTriggered(emptyDiaryEntry().rightNow)).toEqual({ emergency: false, selfHarm: false, items: [] })
  })

  it.each(RIGHT_NOW_ITEMS)('%s alone is an emergency, and the server agrees', (item) => {
    const entry = entryWith(rightNow(item))
    expect(rightNowTriggered(entry.rightNow)).toEqual({
      emergency: true,
      selfHarm: item === 'selfHarmThoughts',
      items: [item],
    })
    expect(triage(entry).level).toBe('emergency')
  })

  it('self-harm thoughts get the crisis-line instruction, not the general one', () => {
    const selfHarm = triage(entryWith(rightNow('selfHarmThoughts'))).reasons[0]
    const chestPain = triage(entryWith(rightNow('chestPain'))).reasons[0]
    expect(selfHarm?.instructionKey).toBe('triage.rules.right-now-self-harm.instruction')
    expect(selfHarm?.instructionKey).not.toBe(chestPain?.instructionKey)
  })
})

describe('locale strings for triage', () => {
  const lookup = (root: unknown, key: string): unknown =>
    key.split('.').reduce<unknown>((node, part) => (node && typeof node === 'object' ? (node as Record<string, unknown>)[part] : undefined), root)

  it('every reason, instruction and level has English and Spanish text', () => {
    const keys = [
      ...ALL_RULES.flatMap(rule => [rule.reasonKey, rule.instructionKey]),
      ...LEVELS.map(l => `triage.levels.${l}`),
      ...LEVELS.map(levelInstructionKey),
      'triage.raisedBy.baseline',
      'triage.raisedBy.flare-watch',
      'triage.raisedBy.risk',
    ]
    for (const key of keys) {
      expect(typeof lookup(en, key), `en ${key}`).toBe('string')
      expect(typeof lookup(es, key), `es ${key}`).toBe('string')
    }
  })

  it('emergency instructions carry the {number} placeholder; self-harm the {crisisLine} too', () => {
    for (const rule of TRIAGE_RULES.filter(r => r.level === 'emergency')) {
      for (const locale of [en, es]) {
        expect(String(lookup(locale, rule.instructionKey)), rule.id).toContain('{number}')
      }
    }
    for (const locale of [en, es]) {
      expect(String(lookup(locale, 'triage.rules.right-now-self-harm.instruction'))).toContain('{crisisLine}')
      expect(String(lookup(locale, levelInstructionKey('emergency')))).toContain('{number}')
    }
  })
})

describe('pain (issue 9; Serlin 1995; NICE NG234)', () => {
  it('9/10 back pain on a first entry, and a steady 7/10 back pain, are urgent (NG234: severe unremitting spinal pain)', () => {
    expect(triage(entryWith(painOf(9, 'back'))).level).toBe('urgent')
    expect(triage(entryWith(painOf(7, 'back')), { baseline: steadyBaseline(painOf(7, 'back')) }).level).toBe('urgent')
  })

  it('severe pain elsewhere is routine when steady and urgent when new or worse (Serlin 1995: 7-10 severe)', () => {
    expect(triage(entryWith(painOf(7, 'hips'))).level).toBe('routine')
    expect(triage(entryWith(painOf(10, 'other'))).level).toBe('routine')
    expect(triage(entryWith(painOf(7, 'hips'), newOrWorse)).level).toBe('urgent')
    expect(triage(entryWith(painOf(6, 'hips'))).level).toBe('none')
  })

  it.each([0, 1, 4, 10])('spinal pain %i/10 with tingling or numbness is an emergency, in or out of the flare watch', (worst) => {
    expect(triage(entryWith(painOf(worst, 'neck'), tingling)).level).toBe('emergency')
    expect(triage(entryWith(painOf(worst, 'back'), tingling), { flareWatchActive: true }).level).toBe('emergency')
  })

  it('band-like (radicular) pain with tingling is an emergency; pain elsewhere with tingling urgent; tingling with no pain routine', () => {
    expect(triage(entryWith(painOf(3, 'ribs'), e => (e.pain.bandLike = true), tingling)).level).toBe('emergency')
    expect(triage(entryWith(painOf(3, 'legs'), tingling)).level).toBe('urgent')
    expect(triage(entryWith(tingling)).level).toBe('routine')
  })

  it('back pain 2 -> 5 since the last report, "worse" not ticked, is urgent (NG234: progressive spinal pain)', () => {
    expect(triage(entryWith(painOf(5, 'back')), { baseline: [entryWith(painOf(2, 'back'))] }).level).toBe('urgent')
    expect(triage(entryWith(painOf(5, 'back')), { baseline: [entryWith(painOf(4, 'back'))] }).level).toBe('none')
  })

  it('spinal pain with a right-now neurological sign gives the spinal-cord reason besides the right-now one', () => {
    const result = triage(entryWith(painOf(2, 'back'), rightNow('troubleWalking')))
    expect(result.level).toBe('emergency')
    expect(result.reasons.map(r => r.rule)).toEqual(expect.arrayContaining(['right-now-walking', 'spinal-pain-neurological']))
  })
})

describe('blood sugar (ADA Standards of Care 2025, section 6; glucose mmol/L x 18.016 = mg/dL)', () => {
  const thirsty: Change = e => (e.sugar.veryThirsty = true)

  it('checks 70 -> not low; 69 -> level 1; 54 -> level 1; 53 -> level 2 (REFERENCES.md)', () => {
    expect(triage(entryWith(glucose(70, 'mg/dL'))).level).toBe('none')
    expect(firedRules(entryWith(glucose(69, 'mg/dL')))).toEqual(['glucose-low'])
    expect(triage(entryWith(glucose(54, 'mg/dL'))).level).toBe('routine')
    expect(triage(entryWith(glucose(53, 'mg/dL'))).level).toBe('urgent')
  })

  it('in mmol/L: 3.8 (68.5 mg/dL) is level 1, 3.9 (70.3) is not; 2.9 (52.2) is level 2, 3.0 (54.05) is not', () => {
    expect(triage(entryWith(glucose(3.8, 'mmol/L'))).level).toBe('routine')
    expect(triage(entryWith(glucose(3.9, 'mmol/L'))).level).toBe('none')
    expect(triage(entryWith(glucose(2.9, 'mmol/L'))).level).toBe('urgent')
    expect(triage(entryWith(glucose(3.0, 'mmol/L'))).level).toBe('routine')
  })

  it('a reading never lowers what the symptoms alone give (issue 9)', () => {
    const alone = triage(entryWith(thirsty)).level
    expect(alone).toBe('routine')
    for (const value of [20, 69, 100, 150, 199, 200, 299, 300, 600]) {
      const withReading = triage(entryWith(thirsty, glucose(value, 'mg/dL'))).level
      expect(compareLevels(withReading, alone), `${value} mg/dL`).toBeGreaterThanOrEqual(0)
    }
  })

  it('200 mg/dL or more with symptoms of high sugar is routine (ADA); 300 or more urgent (from memory)', () => {
    expect(firedRules(entryWith(thirsty, glucose(11.1, 'mmol/L')))).toContain('glucose-high-with-symptoms')
    expect(triage(entryWith(thirsty, glucose(300, 'mg/dL'))).level).toBe('urgent')
  })

  it('needing help for a low sugar (level 3) is urgent; signs of low sugar alone are routine', () => {
    expect(triage(entryWith(e => (e.sugar.neededHelpForLowSugar = true))).level).toBe('urgent')
    expect(triage(entryWith(e => (e.sugar.lowSugarSigns = true))).level).toBe('routine')
  })
})

describe('heart and circulation together (ESC heart failure 2021 and syncope 2018, from memory)', () => {
  it.each([
    [['legSwelling', 'breathlessLightEffort'], 'urgent'],
    [['racingOrIrregular', 'breathlessLightEffort'], 'urgent'],
    [['racingOrIrregular', 'legSwelling', 'breathlessLightEffort'], 'urgent'],
    [['fainting', 'legSwelling'], 'emergency'],
    [['fainting', 'breathlessLightEffort'], 'emergency'],
    [['fainting', 'racingOrIrregular'], 'emergency'],
    [['oneLegPainfulSwollen', 'breathlessLightEffort'], 'emergency'],
  ] as [(keyof DiaryEntryInput['heart'])[], TriageLevel][])('%j together is %s, above each alone', (signs, level) => {
    expect(triage(entryWith(heart(...signs))).level).toBe(level)
    for (const sign of signs) expect(compareLevels(triage(entryWith(heart(sign))).level, level), sign).toBeLessThan(0)
  })

  it('one sign alone stays as before: racing, leg swelling, breathless routine; fainting urgent', () => {
    expect(triage(entryWith(heart('racingOrIrregular'))).level).toBe('routine')
    expect(triage(entryWith(heart('fainting'))).level).toBe('urgent')
    expect(triage(entryWith(heart('oneLegPainfulSwollen'))).level).toBe('urgent')
  })
})

describe('fever (NICE CG151; CTCAE v5.0 fever; common practice)', () => {
  it('converts °F: 100.4 °F = (100.4 - 32) x 5 / 9 = 38.0 °C is a fever, 100.3 °F (37.94 °C) is not', () => {
    expect(temperatureCelsius({ unit: '°F', value: 100.4 })).toBeCloseTo(38.0, 6)
    expect(temperatureCelsius({ unit: '°F', value: 212 })).toBeCloseTo(100, 6)
    expect(firedRules(entryWith(temperature(100.4, '°F')))).toContain('fever')
    expect(firedRules(entryWith(temperature(100.3, '°F')))).not.toContain('fever')
  })

  it('without chemotherapy: fever alone routine; with shaking chills, new confusion or burning urine urgent', () => {
    expect(triage(entryWith(temperature(38.5))).level).toBe('routine')
    expect(triage(entryWith(temperature(38.5), yes('infection', 'shakingChills'))).level).toBe('urgent')
    expect(triage(entryWith(temperature(38.5), yes('mind', 'confusedOrHardToWake'))).level).toBe('urgent')
    expect(triage(entryWith(temperature(38.5), e => (e.urinary.burning = true))).level).toBe('urgent')
  })

  it('during chemotherapy: 38 °C or more, or feeling unwell with no reading, is an emergency (NICE CG151)', () => {
    expect(triage(entryWith(temperature(38.0)), risk('chemotherapy')).level).toBe('emergency')
    expect(triage(entryWith(yes('infection'), yes('infection', 'feelsUnwell')), risk('chemotherapy')).level).toBe('emergency')
    expect(triage(entryWith(yes('infection'), yes('infection', 'feelsUnwell'))).level).toBe('routine')
  })
})

describe('CTCAE v5.0 bowel grades (REFERENCES.md)', () => {
  it('diarrhoea: 0 -> 0, 1-3 -> 1, 4-6 -> 2, 7 or more -> 3 extra stools a day', () => {
    expect([0, 1, 3, 4, 6, 7, 30].map(gradeDiarrhoea)).toEqual([0, 1, 1, 2, 2, 3, 3])
  })

  it('constipation: none 0, occasional 1, persistent 2, no movement despite laxatives 3 (our mapping of grade 3)', () => {
    expect((['none', 'occasional', 'persistent', 'no-movement-despite-laxatives'] as const).map(gradeConstipation)).toEqual([0, 1, 2, 3])
  })
})

describe('a risk factor ranks its related symptoms one step higher (prescribing information, Warnings; common practice)', () => {
  it.each([
    ['spinalMetastases', entryWith(painOf(3, 'hips'), e => (e.pain.wakesAtNight = true)), 'routine', 'urgent'],
    ['spinalMetastases', entryWith(painOf(4, 'back'), newOrWorse), 'urgent', 'emergency'],
    ['urinaryObstruction', entryWith(weakStream), 'routine', 'urgent'],
    ['diabetes', entryWith(e => (e.sugar.veryThirsty = true)), 'routine', 'urgent'],
    ['diabetes', entryWith(glucose(50, 'mg/dL')), 'urgent', 'urgent'],
    ['heartDisease', entryWith(heart('legSwelling', 'breathlessLightEffort')), 'urgent', 'emergency'],
    ['longQt', entryWith(heart('fainting')), 'urgent', 'emergency'],
    ['seizures', entryWith(yes('headache')), 'routine', 'urgent'],
    ['chemotherapy', entryWith(temperature(35.5)), 'routine', 'urgent'],
  ] as [RiskFactor, DiaryEntryInput, TriageLevel, TriageLevel][])('%s: %s -> %s', (factor, entry, without, withFactor) => {
    expect(triage(entry).level).toBe(without)
    const result = triage(entry, risk(factor))
    expect(result.level).toBe(withFactor)
    expect(result.reasons).toContainEqual(expect.objectContaining({ raisedBy: 'risk', riskFactor: factor }))
  })

  it('a factor alone, or with unrelated findings, raises nothing', () => {
    const all = emptyRiskProfile()
    for (const factor of Object.keys(all) as RiskFactor[]) all[factor] = true
    expect(triage(emptyDiaryEntry(), { riskProfile: all }).level).toBe('none')
    expect(triage(entryWith(e => (e.fatigue = 'limits-usual-activities')), { riskProfile: all }).level).toBe('routine')
  })

  it('long QT raises fainting and palpitations but not leg swelling; heart disease raises both', () => {
    expect(triage(entryWith(heart('legSwelling')), risk('longQt')).level).toBe('routine')
    expect(triage(entryWith(heart('legSwelling')), risk('heartDisease')).level).toBe('urgent')
  })
})

describe('the new diary areas, screening answers alone', () => {
  it.each([
    ['a fever or chills this week', yes('infection')],
    ['a fall', yes('falls')],
    ['a rash, itching or hives after the injection', yes('allergy')],
    ['new muddled thinking or drowsiness', yes('mind')],
    ['a new headache', yes('headache')],
  ] as [string, Change][])('%s alone is routine', (_label, change) => {
    expect(triage(entryWith(change)).level).toBe('routine')
  })

  it('a bare "yes, a change in my bowels" with no detail raises nothing (the details carry it)', () => {
    expect(triage(entryWith(e => (e.bowel.any = true))).level).toBe('none')
  })
})
