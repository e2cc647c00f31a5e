import { DateTime } from 'luxon'
import type { DiaryEntryInput } from '../diary/schemas'
import type { RiskFactor, RiskProfile } from './risk-profile'
import { glucoseToMgDl } from '../labs/calculations'
import {
  gradeConstipation,
  gradeDiarrhoea,
  gradeFatigue,
  gradeHotFlashes,
  gradeInjectionSite,
  ipss,
  phq2,
  temperatureCelsius,
} from '../diary/scores'
import type { CtcaeGrade } from '../diary/scores'

/*
 * Triage of a weekly diary entry. The same function runs in the page (for the instant
 * right-now screen) and on the server, which is the authority.
 *
 * Two tables of rules:
 * - TRIAGE_RULES set a fixed level when their test is true;
 * - RAISE_RULES (worse than his last report, flare watch, a risk factor on his record)
 *   raise a symptom: they start from the highest level reached by the fixed rules about
 *   the same symptom (`symptomRules`, 'none' if none of them fired), go one step up and
 *   stay within the limits each one states (never below where the symptom already is).
 *   Raising the symptom rather than the whole entry keeps an unrelated finding from being
 *   pushed up with it. Raises start from the fixed rules only, so two raises never stack.
 * The entry's level is the highest level any rule reaches; every rule that fired is kept
 * as a reason. A free-text note gives the routine reason 'note-to-read' (a person reads
 * every note) and never lowers a level.
 *
 * Safe by construction (tests/unit/triage-properties.test.ts): every test below only
 * ever asks "is this answer at least as bad as ...", so a worse answer, an extra body
 * site, the flare watch or a risk factor can add reasons and never remove one.
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

/** Worse by this much since the last report raises the symptom one step (pain NRS points, PHQ-2 points or CTCAE grades; Basch, from memory). */
export const WORSENING_POINTS = 2

/** The right-now items that are neurological signs of spinal cord compression (NICE NG234). */
const NEUROLOGICAL_RIGHT_NOW: readonly RightNowItem[] = ['newWeakness', 'newNumbness', 'troubleWalking', 'bladderBowelControl']

export const TRIAGE_SOURCES = {
  nice: 'NICE guideline NG234 (2023), Spinal metastases and metastatic spinal cord compression',
  niceImmediate: 'NICE guideline NG234 (2023): spinal pain with neurological symptoms (numbness, sensory loss, weakness, walking, bladder or bowel) is an emergency, seen at once',
  niceSevereBack: 'NICE guideline NG234 (2023): severe unremitting, night or straining spinal pain needs review within 24 hours',
  flare: 'GnRH-agonist depot prescribing information, Warnings (tumour flare); common practice',
  commonPractice: 'Common practice (emergency care)',
  contraindication: 'GnRH-agonist depot prescribing information, Contraindications: hypersensitivity to GnRH, GnRH-agonist analogues or any of the product\'s other ingredients',
  selfHarm: 'Kroenke K et al., Med Care 2003 (PHQ-2); any thought of self-harm is an emergency: common practice',
  serlin: 'Serlin RC et al., Pain 1995 (7-10 is severe); new or worse: common practice',
  serlinSevere: 'Serlin RC et al., Pain 1995 (7-10 is severe); at least a routine review whether or not new: common practice',
  pain: 'Night pain or pain worse on straining are NICE NG234 warning features; outside the spine a routine review: common practice',
  tingling: 'Tingling or numbness (nerve root, spinal cord or neuropathy): routine review, common practice; with spinal pain see NICE NG234',
  ctcae: 'CTCAE v5.0 (NCI, 2017)',
  message: 'A message to the care team is answered within the clinic\'s routine response target: common practice',
  glucose: 'Home glucose at or above 300 mg/dL (16.7 mmol/L) needs same-day advice: from memory',
  ada: 'ADA Standards of Care 2025 (symptoms of high blood sugar); common practice',
  adaHigh: 'ADA Standards of Care 2025, section 2: random glucose 200 mg/dL (11.1 mmol/L) or more with symptoms of high blood sugar',
  adaLow1: 'ADA Standards of Care 2025, section 6: level 1 hypoglycaemia below 70 mg/dL (3.9 mmol/L)',
  adaLow2: 'ADA Standards of Care 2025, section 6: level 2 hypoglycaemia below 54 mg/dL (3.0 mmol/L); same-day call: common practice',
  adaLow3: 'ADA Standards of Care 2025, section 6: level 3 hypoglycaemia (needed help from another person); same-day call: common practice',
  adaLowSigns: 'ADA Standards of Care 2025, section 6 (symptoms of hypoglycaemia); routine review: common practice',
  barry: 'Barry MJ et al., J Urol 1992 (IPSS 20-35 is severe)',
  weakStream: 'GnRH-agonist depot prescribing information, Warnings (urinary tract obstruction); routine review of a weak stream: common practice',
  kroenke: 'Kroenke K et al., Med Care 2003 (PHQ-2 of 3 or more is a positive screen)',
  basch: 'Basch E et al., J Clin Oncol 2016 and JAMA 2022 (PRO-TECT): alert when worse by 2 or more points since the last report (from memory)',
  cardiac: 'GnRH-agonist depot prescribing information, Warnings (cardiovascular disease, QT prolongation); routine review: common practice',
  heartTogether: 'ESC heart failure guidelines 2021 (breathlessness, ankle swelling and palpitations together are typical of heart failure or an arrhythmia): from memory; same-day call: common practice',
  syncope: 'ESC syncope guidelines 2018 (fainting with palpitations, breathlessness or signs of heart failure is high risk, sent to emergency care): from memory',
  dvt: 'One painful swollen leg may be a deep vein thrombosis: same-day assessment, common practice (from memory)',
  urinaryInfection: 'Burning on passing urine may be a urinary infection; routine review: common practice',
  note: 'Common practice: every free-text note is read by a person (Tidewell issue 9)',
  niceFever: 'NICE CG151 (2012), Neutropenic sepsis: a fever of 38 °C or more, or feeling unwell, during chemotherapy is an emergency (from memory for the wording)',
  feverSameDay: 'A fever with shaking chills, new confusion or burning urine needs same-day advice: common practice (REFERENCES.md, fever during cancer treatment); with diarrhoea or vomiting (infective, dehydration): common practice',
  fever: 'CTCAE v5.0 fever grade 1 from 38.0 °C; without chemotherapy a routine review: common practice',
  lowTemperature: 'A temperature below 36 °C can be a sign of sepsis (NICE NG51, from memory); routine review: common practice',
  infection: 'Fever, chills or feeling unwell reported without a raised reading: routine review, common practice',
  diarrhoea2: 'CTCAE v5.0 diarrhoea grade 2 (4-6 stools a day over his usual)',
  diarrhoea3: 'CTCAE v5.0 diarrhoea grade 3 (7 or more stools a day over his usual)',
  constipation2: 'CTCAE v5.0 constipation grade 2 (persistent, regular laxatives)',
  constipation3: 'CTCAE v5.0 constipation grade 3 (obstipation); no movement despite laxatives needs a same-day call: common practice',
  giBleed: 'Blood or black stool may be bleeding in the gut: same-day assessment, common practice',
  vomiting: 'Vomiting or not keeping fluids down: routine review, common practice',
  hypercalcaemia: 'Vomiting with confusion may be high calcium from bone metastases: same-day call, common practice',
  falls: 'GnRH-agonist depot prescribing information, Warnings (loss of bone mineral density); a fall is reviewed: common practice',
  fracture: 'GnRH-agonist depot prescribing information, Warnings (loss of bone mineral density); a fall with injury, a hit head or a leg that cannot bear weight may be a fracture: same day, common practice',
  hypersensitivity: 'GnRH-agonist depot prescribing information (hypersensitivity reactions, injection-site reactions); routine review: common practice',
  spreadingRash: 'A spreading rash or hives, or swollen lips or eyes, may be a hypersensitivity reaction (prescribing information): same day, common practice',
  confusion: 'New confusion or unusual drowsiness (delirium: infection, high calcium, low sugar, the brain): same day, common practice',
  memory: 'Memory or concentration changes during androgen deprivation (prescribing information, adverse reactions; from memory): routine review, common practice',
  headache: 'A new or unusual headache: routine review, common practice',
  suddenHeadache: 'A sudden, very bad headache, the worst he has had (thunderclap): emergency care, common practice (NICE CKS headache red flags, from memory); pituitary apoplexy is in the GnRH-agonist prescribing information (from memory)',
  progressiveSpine: 'NICE guideline NG234 (2023): progressive spinal pain needs review within 24 hours; worse by 2 or more since the last report (Basch, from memory)',
  painTingling: 'NICE guideline NG234 (2023): radicular pain with sensory change; pain with tingling anywhere may come from a nerve root, same day: common practice',
  barryChange: 'Barry MJ et al., J Urol 1995: a rise of about 3 IPSS points is a change men notice (from memory); routine review: common practice',
  lungClot: 'One painful swollen leg with breathlessness or a racing heart may be a pulmonary embolism (Wells criteria, NICE NG158, from memory): emergency, common practice',
  adaHighAlone: 'ADA Standards of Care 2025, section 2: a glucose of 200 mg/dL (11.1 mmol/L) or more suggests diabetes, to be confirmed; GnRH-agonist prescribing information, Warnings (hyperglycaemia)',
  highFever: 'CTCAE v5.0 fever grade 2 or more (above 39.0 °C); same-day call: common practice',
  dehydration: 'Diarrhoea with vomiting (dehydration and kidney injury in an older man): same day, common practice',
  obstruction: 'No bowel movement despite laxatives with vomiting may be a bowel obstruction: emergency care, common practice',
  bleedCollapse: 'Blood or black stool with fainting (bleeding with collapse): emergency care, common practice',
  headInjury: 'A hit head or injury with new confusion after a fall: emergency care (NICE NG232 head injury, from memory); common practice',
  anaphylaxis: 'A rash or hives with fainting (skin signs with collapse meet anaphylaxis criteria, WAO 2020, from memory); GnRH-agonist prescribing information (hypersensitivity)',
  lowSugarConfusion: 'ADA Standards of Care 2025, section 6: low sugar with altered mental state is level 3, emergency; common practice',
  highSugarConfusion: 'Very high glucose with confusion may be a hyperglycaemic crisis (ADA hyperglycaemic crises consensus, from memory): emergency, common practice',
  apoplexy: 'GnRH-agonist depot prescribing information, Warnings and post-marketing: pituitary apoplexy (sudden headache, vomiting, change in sight), from memory; emergency: common practice',
  retention: 'GnRH-agonist depot prescribing information, Warnings (tumour flare); common practice; acute urinary retention',
  anaphylaxisNow: 'Common practice (emergency care); anaphylaxis',
  injectionSiteReaction: 'CTCAE v5.0 (NCI, 2017), injection site reaction',
  baschMood: 'Basch E et al., J Clin Oncol 2016 and JAMA 2022 (PRO-TECT): alert when worse by 2 or more points since the last report (from memory); Kroenke K et al., Med Care 2003 (PHQ-2 of 3 or more is a positive screen)',
  flareSpine: 'GnRH-agonist depot prescribing information, Warnings (tumour flare); common practice; NICE guideline NG234 (2023), Spinal metastases and metastatic spinal cord compression',
  flareUrinary: 'GnRH-agonist depot prescribing information, Warnings (tumour flare; urinary tract obstruction); common practice',
  riskSpinalMetastases: 'GnRH-agonist depot prescribing information, Warnings (men with vertebral metastases watched closely); NICE NG234',
  riskUrinaryObstruction: 'GnRH-agonist depot prescribing information, Warnings (men with urinary tract obstruction watched closely)',
  riskDiabetes: 'GnRH-agonist depot prescribing information, Warnings (hyperglycaemia and diabetes); ADA Standards of Care 2025; at most a same-day call: common practice',
  riskHeartDisease: 'GnRH-agonist depot prescribing information, Warnings (cardiovascular disease); ESC syncope guidelines 2018 (fainting with heart disease is high risk), from memory',
  riskLongQt: 'GnRH-agonist depot prescribing information, Warnings (QT prolongation); fainting or palpitations with a long QT may be an arrhythmia: from memory',
  riskSeizures: 'GnRH-agonist depot prescribing information, Warnings (convulsions, post-marketing; from memory); common practice',
  riskChemotherapy: 'NICE CG151 (2012), Neutropenic sepsis: a fever of 38 °C or more, or feeling unwell, during chemotherapy is an emergency (from memory for the wording); diarrhoea or vomiting during chemotherapy the same day: common practice',
} as const

/** The numbers of his last report that a worsening is measured against. */
export interface Baseline {
  /** Worst pain (0-10) in his last report. */
  pain: number
  /** CTCAE-style grades in his last report. */
  hotFlushes: number
  fatigue: number
  injectionSite: number
  diarrhoea: number
  constipation: number
  /** PHQ-2 total (0-6) in his last report. */
  mood: number
  /** IPSS total (0-35) of his last report that had one (monthly); null when none had. */
  ipss: number | null
}

/** What a rule's test can see besides the entry. */
export interface RuleContext {
  flareWatchActive: boolean
  /** His last report's numbers; null when there is none. */
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
  /** The raise goes no higher than this (and never below the symptom's own level). */
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
const diarrhoeaGrade = (entry: DiaryEntryInput): CtcaeGrade => gradeDiarrhoea(entry.bowel.extraStoolsPerDay)
const constipationGrade = (entry: DiaryEntryInput): CtcaeGrade => gradeConstipation(entry.bowel.constipation)

/** Pain in the back or neck, or band-like (radicular) pain: the spinal pain of NICE NG234. */
const spinalPain = ({ pain }: DiaryEntryInput) => pain.bandLike || hasAny(pain.locations, SPINE_LOCATIONS)

/*
 * The reading in whole mg/dL (meters show whole mg/dL), so that the ADA's paired values
 * agree: 3.9 mmol/L -> 70 (not low), 3.0 -> 54 (not level 2), 11.1 -> 200, 16.7 -> 301.
 */
const glucoseMgDl = ({ sugar }: DiaryEntryInput): number | null =>
  sugar.glucose === undefined ? null : Math.round(glucoseToMgDl(sugar.glucose))
const glucoseBelow = (entry: DiaryEntryInput, mgDl: number) => {
  const value = glucoseMgDl(entry)
  return value !== null && value < mgDl
}
const glucoseAtLeast = (entry: DiaryEntryInput, mgDl: number) => {
  const value = glucoseMgDl(entry)
  return value !== null && value >= mgDl
}
const highSugarSymptoms = ({ sugar }: DiaryEntryInput) => sugar.veryThirsty || sugar.urinatingMore || sugar.blurredVision

const celsius = ({ infection }: DiaryEntryInput): number | null =>
  infection.temperature === undefined ? null : temperatureCelsius(infection.temperature)
/** A temperature of 38 °C or more (NICE CG151; CTCAE v5.0 fever grade 1 starts at 38.0). */
const FEVER_CELSIUS = 38
const fever = (entry: DiaryEntryInput) => {
  const value = celsius(entry)
  return value !== null && value >= FEVER_CELSIUS - 1e-9
}
const newConfusion = ({ mind }: DiaryEntryInput) => mind.any || mind.confusedOrHardToWake

/** Signs of the heart and circulation that rank higher together (see 'heart-signs-together'). */
const HEART_SIGNS = ['fainting', 'racingOrIrregular', 'legSwelling', 'breathlessLightEffort'] as const

export const TRIAGE_RULES: readonly TriageRule[] = [
  // Emergency: any right-now item. Call the local emergency number now.
  rightNowRule('right-now-weakness', 'newWeakness', TRIAGE_SOURCES.nice),
  rightNowRule('right-now-numbness', 'newNumbness', TRIAGE_SOURCES.nice),
  rightNowRule('right-now-walking', 'troubleWalking', TRIAGE_SOURCES.nice),
  rightNowRule('right-now-bladder-bowel', 'bladderBowelControl', TRIAGE_SOURCES.nice),
  rightNowRule('right-now-cannot-pass-urine', 'cannotPassUrine', TRIAGE_SOURCES.retention),
  rightNowRule('right-now-chest-pain', 'chestPain', TRIAGE_SOURCES.commonPractice),
  rightNowRule('right-now-breathing', 'hardToBreathe', TRIAGE_SOURCES.commonPractice),
  rightNowRule('right-now-stroke-signs', 'faceDroopSpeech', TRIAGE_SOURCES.commonPractice),
  rightNowRule('right-now-seizure', 'seizure', TRIAGE_SOURCES.commonPractice),
  rightNowRule('right-now-face-throat-swelling', 'faceThroatSwelling', TRIAGE_SOURCES.anaphylaxisNow),
  rightNowRule('right-now-self-harm', 'selfHarmThoughts', TRIAGE_SOURCES.selfHarm),

  // Emergency from the rest of the diary: signs that together call for emergency care.
  // Spinal pain with any neurological sign, whatever the score (NICE NG234: suspected
  // spinal cord compression is seen at once).
  rule('spinal-pain-neurological', 'emergency', TRIAGE_SOURCES.niceImmediate, entry =>
    spinalPain(entry)
    && (entry.pain.tinglingOrNumbness || NEUROLOGICAL_RIGHT_NOW.some(item => entry.rightNow[item]))),
  rule('fever-during-chemotherapy', 'emergency', TRIAGE_SOURCES.niceFever, (entry, { riskProfile }) =>
    riskProfile?.chemotherapy === true && (fever(entry) || entry.infection.feelsUnwell || entry.infection.shakingChills)),
  rule('black-stool-with-fainting', 'emergency', TRIAGE_SOURCES.bleedCollapse, ({ bowel, heart }) =>
    bowel.bloodOrBlackStool && heart.fainting),
  rule('constipation-with-vomiting', 'emergency', TRIAGE_SOURCES.obstruction, entry =>
    constipationGrade(entry) >= 3 && entry.bowel.vomiting),
  rule('head-injury-with-confusion', 'emergency', TRIAGE_SOURCES.headInjury, entry =>
    entry.falls.hitHeadOrHurt && newConfusion(entry)),
  rule('rash-with-fainting', 'emergency', TRIAGE_SOURCES.anaphylaxis, ({ allergy, heart }) =>
    (allergy.any || allergy.spreading) && heart.fainting),
  rule('low-sugar-with-confusion', 'emergency', TRIAGE_SOURCES.lowSugarConfusion, entry =>
    glucoseBelow(entry, 70) && newConfusion(entry)),
  rule('high-sugar-with-confusion', 'emergency', TRIAGE_SOURCES.highSugarConfusion, entry =>
    glucoseAtLeast(entry, 300) && newConfusion(entry)),
  rule('headache-sudden-severe', 'emergency', TRIAGE_SOURCES.suddenHeadache, ({ headache }) => headache.suddenSevere),
  rule('fainting-with-heart-signs', 'emergency', TRIAGE_SOURCES.syncope, ({ heart }) =>
    heart.fainting && (heart.racingOrIrregular || heart.breathlessLightEffort || heart.legSwelling)),
  rule('possible-lung-clot', 'emergency', TRIAGE_SOURCES.lungClot, ({ heart }) =>
    heart.oneLegPainfulSwollen && (heart.breathlessLightEffort || heart.racingOrIrregular)),
  rule('headache-vision-or-vomiting', 'emergency', TRIAGE_SOURCES.apoplexy, ({ headache, bowel }) =>
    headache.visionOrVomiting || ((headache.any || headache.suddenSevere) && bowel.vomiting)),

  // Urgent: a nurse calls the same day.
  rule('spinal-pain-pattern', 'urgent', TRIAGE_SOURCES.niceSevereBack, ({ pain }) =>
    pain.bandLike
    || (hasAny(pain.locations, SPINE_LOCATIONS) && (pain.newOrWorse || pain.wakesAtNight || pain.worseOnStraining || pain.worst >= 7))),
  rule('spinal-pain-worse-since-last', 'urgent', TRIAGE_SOURCES.progressiveSpine, ({ pain }, { baseline }) =>
    hasAny(pain.locations, SPINE_LOCATIONS) && baseline !== null && pain.worst - baseline.pain >= WORSENING_POINTS),
  rule('pain-with-tingling', 'urgent', TRIAGE_SOURCES.painTingling, ({ pain }) => pain.worst >= 1 && pain.tinglingOrNumbness),
  rule('severe-pain-new-or-worse', 'urgent', TRIAGE_SOURCES.serlin, ({ pain }) =>
    pain.worst >= 7 && pain.newOrWorse),
  rule('blood-in-urine', 'urgent', TRIAGE_SOURCES.commonPractice, ({ urinary }) => urinary.blood),
  rule('fainting', 'urgent', TRIAGE_SOURCES.commonPractice, ({ heart }) => heart.fainting),
  rule('heart-signs-together', 'urgent', TRIAGE_SOURCES.heartTogether, ({ heart }) =>
    HEART_SIGNS.filter(sign => heart[sign]).length >= 2),
  rule('one-leg-painful-swollen', 'urgent', TRIAGE_SOURCES.dvt, ({ heart }) => heart.oneLegPainfulSwollen),
  rule('injection-site-infection', 'urgent', TRIAGE_SOURCES.commonPractice, ({ injectionSite }) =>
    injectionSite.feverOrSpreadingRednessOrPus),
  rule('glucose-very-high', 'urgent', TRIAGE_SOURCES.glucose, entry => glucoseAtLeast(entry, 300)),
  rule('glucose-very-low', 'urgent', TRIAGE_SOURCES.adaLow2, entry => glucoseBelow(entry, 54)),
  rule('low-sugar-needed-help', 'urgent', TRIAGE_SOURCES.adaLow3, ({ sugar }) => sugar.neededHelpForLowSugar),
  rule('fever-with-warning-signs', 'urgent', TRIAGE_SOURCES.feverSameDay, entry =>
    fever(entry) && (entry.infection.shakingChills || newConfusion(entry) || entry.urinary.burning
      || diarrhoeaGrade(entry) >= 2 || entry.bowel.vomiting)),
  rule('fever-high', 'urgent', TRIAGE_SOURCES.highFever, (entry) => {
    const value = celsius(entry)
    return value !== null && value > 39
  }),
  rule('diarrhoea-with-vomiting', 'urgent', TRIAGE_SOURCES.dehydration, entry => diarrhoeaGrade(entry) >= 2 && entry.bowel.vomiting),
  rule('diarrhoea-grade-3', 'urgent', TRIAGE_SOURCES.diarrhoea3, entry => diarrhoeaGrade(entry) >= 3),
  rule('constipation-no-movement', 'urgent', TRIAGE_SOURCES.constipation3, entry => constipationGrade(entry) >= 3),
  rule('blood-or-black-stool', 'urgent', TRIAGE_SOURCES.giBleed, ({ bowel }) => bowel.bloodOrBlackStool),
  rule('vomiting-with-confusion', 'urgent', TRIAGE_SOURCES.hypercalcaemia, entry => entry.bowel.vomiting && newConfusion(entry)),
  rule('fall-injury', 'urgent', TRIAGE_SOURCES.fracture, ({ falls }) => falls.hitHeadOrHurt || falls.cannotBearWeight),
  rule('rash-spreading', 'urgent', TRIAGE_SOURCES.spreadingRash, ({ allergy }) => allergy.spreading),
  rule('confused-or-hard-to-wake', 'urgent', TRIAGE_SOURCES.confusion, ({ mind }) => mind.confusedOrHardToWake),
  rule('hot-flushes-grade-3', 'urgent', TRIAGE_SOURCES.ctcae, entry => hotFlushGrade(entry) >= 3),
  rule('fatigue-grade-3', 'urgent', TRIAGE_SOURCES.ctcae, entry => fatigueGrade(entry) >= 3),

  // Routine: a nurse is in touch within a few working days.
  rule('severe-pain', 'routine', TRIAGE_SOURCES.serlinSevere, ({ pain }) => pain.worst >= 7),
  rule('pain-night-or-straining', 'routine', TRIAGE_SOURCES.pain, ({ pain }) => pain.wakesAtNight || pain.worseOnStraining),
  rule('tingling-or-numbness', 'routine', TRIAGE_SOURCES.tingling, ({ pain }) => pain.tinglingOrNumbness),
  rule('weak-stream', 'routine', TRIAGE_SOURCES.weakStream, ({ urinary }) => urinary.weakStreamOrStraining),
  rule('ipss-severe', 'routine', TRIAGE_SOURCES.barry, ({ urinary }) =>
    urinary.ipss !== undefined && ipss(urinary.ipss.items).band === 'severe'),
  rule('phq2-positive', 'routine', TRIAGE_SOURCES.kroenke, ({ mood }) =>
    phq2(mood.phq2Interest, mood.phq2Down).positive),
  // With or without a reading: a reading never lowers what the symptoms give (issue 9).
  rule('high-sugar-symptoms', 'routine', TRIAGE_SOURCES.ada, highSugarSymptoms),
  rule('glucose-high-with-symptoms', 'routine', TRIAGE_SOURCES.adaHigh, entry =>
    glucoseAtLeast(entry, 200) && highSugarSymptoms(entry)),
  rule('glucose-high', 'routine', TRIAGE_SOURCES.adaHighAlone, entry => glucoseAtLeast(entry, 200)),
  rule('glucose-low', 'routine', TRIAGE_SOURCES.adaLow1, entry => glucoseBelow(entry, 70)),
  rule('low-sugar-signs', 'routine', TRIAGE_SOURCES.adaLowSigns, ({ sugar }) => sugar.lowSugarSigns),
  rule('infection-signs', 'routine', TRIAGE_SOURCES.infection, ({ infection }) =>
    infection.any || infection.shakingChills || infection.feelsUnwell),
  rule('fever', 'routine', TRIAGE_SOURCES.fever, fever),
  rule('temperature-low', 'routine', TRIAGE_SOURCES.lowTemperature, (entry) => {
    const value = celsius(entry)
    return value !== null && value < 36
  }),
  rule('diarrhoea-grade-2', 'routine', TRIAGE_SOURCES.diarrhoea2, entry => diarrhoeaGrade(entry) >= 2),
  rule('constipation-persistent', 'routine', TRIAGE_SOURCES.constipation2, entry => constipationGrade(entry) >= 2),
  rule('vomiting', 'routine', TRIAGE_SOURCES.vomiting, ({ bowel }) => bowel.vomiting),
  rule('fall', 'routine', TRIAGE_SOURCES.falls, ({ falls }) => falls.any),
  rule('rash-after-injection', 'routine', TRIAGE_SOURCES.hypersensitivity, ({ allergy }) => allergy.any),
  rule('mind-changes', 'routine', TRIAGE_SOURCES.memory, ({ mind }) => mind.any || mind.memoryOrConcentration),
  rule('headache-new', 'routine', TRIAGE_SOURCES.headache, ({ headache }) => headache.any),
  rule('hot-flushes-grade-2', 'routine', TRIAGE_SOURCES.ctcae, entry => hotFlushGrade(entry) >= 2),
  rule('fatigue-grade-2', 'routine', TRIAGE_SOURCES.ctcae, entry => fatigueGrade(entry) >= 2),
  rule('injection-site-signs', 'routine', TRIAGE_SOURCES.injectionSiteReaction, ({ injectionSite }) =>
    injectionSite.pain || injectionSite.redness || injectionSite.swelling || injectionSite.lump),
  rule('heart-racing-or-irregular', 'routine', TRIAGE_SOURCES.cardiac, ({ heart }) => heart.racingOrIrregular),
  rule('leg-swelling', 'routine', TRIAGE_SOURCES.cardiac, ({ heart }) => heart.legSwelling),
  rule('breathless-light-effort', 'routine', TRIAGE_SOURCES.cardiac, ({ heart }) => heart.breathlessLightEffort),
  rule('burning-urine', 'routine', TRIAGE_SOURCES.urinaryInfection, ({ urinary }) => urinary.burning),
  // Every note is read by a person: a note alone opens a routine "note to read" item.
  rule('note-to-read', 'routine', TRIAGE_SOURCES.note, entry => (entry.note ?? '').trim().length > 0),
]

const RULES_BY_ID = new Map(TRIAGE_RULES.map(r => [r.id, r]))

/*
 * Answers that cannot raise the level above none on their own (set to their worst on an
 * otherwise empty entry, with no flare watch, baseline or risk factor), with the reason.
 * tests/unit/triage-properties.test.ts walks every answer of the diary schema: each must
 * raise the level alone or be listed here, and nothing listed may raise it.
 */
export const ANSWERS_NOT_RAISING_ALONE: Readonly<Record<string, string>> = {
  'hotFlushes.perDay': 'CTCAE v5.0 grades hot flashes by how far they limit activities (the interference answer); a count alone is grade 1. A rise of 2 grades since the last report raises it.',
  'hotFlushes.worstSeverity': 'CTCAE v5.0 grades hot flashes by how far they limit activities (the interference answer); the severity word alone is grade 1.',
  'pain.locations': 'Says where the pain is; with a score of 0 there is no pain. The places rank the pain once it is there (spinal pattern, flare watch).',
  'pain.newOrWorse': 'Qualifies the pain score; with a score of 0 there is no pain to rank. With any score it raises in the flare watch, with 7 or more always.',
  'urinary.ipss.qualityOfLife': 'Barry 1992: the IPSS bother item is reported beside the total and never added; the seven symptom items carry the triage.',
  'bowel.any': 'Screening question only ("any change"): the details asked after a yes (extra stools, constipation, blood, vomiting) carry the triage; a change with none of them is at most CTCAE grade 1.',
}

/** The numbers of his last report, read from an entry that may come from an older diary. */
function baselineFrom(previous: DiaryEntryInput): Baseline {
  // Entries stored before rules version 3 have no bowel section: read it as "no change"
  // (as withDiaryDefaults in shared/diary/schemas.ts does; imported there would be a cycle).
  const bowel = (previous as Partial<DiaryEntryInput>).bowel
  return {
    pain: previous.pain.worst,
    hotFlushes: hotFlushGrade(previous),
    fatigue: fatigueGrade(previous),
    injectionSite: injectionSiteGrade(previous),
    diarrhoea: bowel ? gradeDiarrhoea(bowel.extraStoolsPerDay) : 0,
    constipation: bowel ? gradeConstipation(bowel.constipation) : 0,
    mood: previous.mood.phq2Interest + previous.mood.phq2Down,
    ipss: null,
  }
}

/**
 * The baseline a worsening is measured against: his last report (the first of the
 * previous entries, given most recent first), as in the Basch trials' alert rule
 * ("worse by 2 or more points since the last report", REFERENCES.md, from memory).
 * Null when there is no earlier report.
 */
export function baselineOf(previous: readonly DiaryEntryInput[]): Baseline | null {
  const last = previous[0]
  if (last === undefined) return null
  // The IPSS is asked once a month: its last report is the latest entry that has one.
  const lastIpss = previous.find(entry => entry.urinary.ipss !== undefined)?.urinary.ipss
  return { ...baselineFrom(last), ipss: lastIpss ? ipss(lastIpss.items).total : null }
}

/** An IPSS total this many points above his last one raises it (Barry 1995, from memory). */
export const IPSS_RISE = 3


function baselineRule(id: string, symptomRules: readonly string[], value: (entry: DiaryEntryInput) => number, last: (baseline: Baseline) => number, source: string = TRIAGE_SOURCES.basch): RaiseRule {
  return {
    id,
    raisedBy: 'baseline',
    symptomRules,
    atLeast: 'routine',
    atMost: 'urgent',
    source,
    ...keys(id),
    test: (entry, { baseline }) => baseline !== null && value(entry) - last(baseline) >= WORSENING_POINTS,
  }
}

function flareRule(id: string, symptomRules: readonly string[], atLeast: TriageLevel, atMost: TriageLevel, test: (entry: DiaryEntryInput) => boolean, source: string = TRIAGE_SOURCES.flareSpine): RaiseRule {
  return {
    id,
    raisedBy: 'flare-watch',
    symptomRules,
    atLeast,
    atMost,
    source,
    ...keys(id),
    test: (entry, context) => context.flareWatchActive && test(entry),
  }
}

/*
 * A risk factor on his record ranks the symptoms related to it one step higher, like the
 * flare watch, but only symptoms the fixed rules already found (a factor alone is no
 * finding). The highest level each may reach is stated with its source.
 */
function riskRule(factor: RiskFactor, symptomRules: readonly string[], atMost: TriageLevel, source: string): RaiseRule {
  const id = `risk-${factor.replace(/[A-Z]/g, letter => `-${letter.toLowerCase()}`)}`
  return {
    id,
    raisedBy: 'risk',
    riskFactor: factor,
    symptomRules,
    atLeast: 'routine',
    atMost,
    source,
    ...keys(id),
    test: (entry, context) => context.riskProfile?.[factor] === true
      && symptomRules.some(ruleId => RULES_BY_ID.get(ruleId)?.test(entry, context) === true),
  }
}

const PAIN_RULES = ['spinal-pain-neurological', 'spinal-pain-pattern', 'spinal-pain-worse-since-last', 'pain-with-tingling', 'severe-pain-new-or-worse', 'severe-pain', 'pain-night-or-straining']
const NEUROLOGICAL_RULES = ['right-now-weakness', 'right-now-numbness', 'right-now-walking', 'right-now-bladder-bowel', 'tingling-or-numbness']
/** Urinary findings; with a known obstruction a fever with warning signs is likely urosepsis (common practice). */
const URINARY_RULES = ['right-now-cannot-pass-urine', 'weak-stream', 'ipss-severe', 'blood-in-urine', 'burning-urine', 'fever-with-warning-signs']
const SUGAR_RULES = ['glucose-high', 'glucose-very-high', 'glucose-very-low', 'low-sugar-needed-help', 'high-sugar-symptoms', 'glucose-high-with-symptoms', 'glucose-low', 'low-sugar-signs']
const HEART_RULES = ['fainting-with-heart-signs', 'fainting', 'heart-signs-together', 'heart-racing-or-irregular', 'leg-swelling', 'breathless-light-effort']
const RHYTHM_RULES = ['fainting-with-heart-signs', 'fainting', 'heart-racing-or-irregular']
const MIND_AND_HEADACHE_RULES = ['head-injury-with-confusion', 'confused-or-hard-to-wake', 'mind-changes', 'vomiting-with-confusion', 'headache-vision-or-vomiting', 'headache-sudden-severe', 'headache-new']
/** Infection, and the bowel upsets that are dangerous during chemotherapy (neutropenic enterocolitis, dehydration; common practice). */
const INFECTION_RULES = ['fever-during-chemotherapy', 'fever-with-warning-signs', 'fever-high', 'fever', 'infection-signs', 'temperature-low',
  'injection-site-infection', 'burning-urine', 'diarrhoea-with-vomiting', 'diarrhoea-grade-3', 'diarrhoea-grade-2', 'vomiting']

export const RAISE_RULES: readonly RaiseRule[] = [
  // Worse by 2 or more since his last report: one step up, at least routine, at most urgent.
  baselineRule('baseline-pain', PAIN_RULES, entry => entry.pain.worst, last => last.pain),
  baselineRule('baseline-hot-flushes', ['hot-flushes-grade-3', 'hot-flushes-grade-2'], hotFlushGrade, last => last.hotFlushes),
  baselineRule('baseline-fatigue', ['fatigue-grade-3', 'fatigue-grade-2'], fatigueGrade, last => last.fatigue),
  baselineRule('baseline-injection-site', ['injection-site-infection', 'injection-site-signs'], injectionSiteGrade, last => last.injectionSite),
  baselineRule('baseline-diarrhoea', ['diarrhoea-grade-3', 'diarrhoea-grade-2'], diarrhoeaGrade, last => last.diarrhoea),
  baselineRule('baseline-constipation', ['constipation-no-movement', 'constipation-persistent'], constipationGrade, last => last.constipation),
  // The points compared are the PHQ-2's, so its source is named beside Basch's.
  baselineRule('baseline-mood', ['phq2-positive'], ({ mood }) => mood.phq2Interest + mood.phq2Down, last => last.mood, TRIAGE_SOURCES.baschMood),
  // The IPSS has 35 points, not a 5-point scale: a rise of 3 since his last IPSS.
  {
    id: 'baseline-ipss',
    raisedBy: 'baseline',
    symptomRules: ['ipss-severe', 'weak-stream'],
    atLeast: 'routine',
    atMost: 'urgent',
    source: TRIAGE_SOURCES.barryChange,
    ...keys('baseline-ipss'),
    test: ({ urinary }, { baseline }) => baseline !== null && baseline.ipss !== null && urinary.ipss !== undefined
      && ipss(urinary.ipss.items).total - baseline.ipss >= IPSS_RISE,
  },

  // Flare watch. Pain in any place counts as possible bone pain: the diary's places leave
  // out the pelvis, shoulders, skull and breastbone, where bone metastases are common, so
  // "other" may be bone too (and one more place ticked can then never lower the level).
  // New or worse pain of 4 or more: one step up, at least urgent.
  // Severe pain (7 or more) counts whether or not he ticked "new": on a first entry there
  // is nothing to compare with, and a flare is a worsening by definition.
  flareRule('flare-watch-bone-pain', PAIN_RULES, 'urgent', 'emergency', ({ pain }) =>
    (pain.worst >= 4 && pain.newOrWorse) || pain.worst >= 7),
  // Mild new or worse pain (1 or more): one step up, at least routine, at most urgent.
  flareRule('flare-watch-mild-bone-pain', PAIN_RULES, 'routine', 'urgent', ({ pain }) =>
    pain.worst >= 1 && pain.newOrWorse),
  // The flare's urinary obstruction is the prescribing information's warning; NICE NG234
  // (spinal cord compression) is not its basis.
  flareRule('flare-watch-urinary', ['right-now-cannot-pass-urine', 'ipss-severe', 'weak-stream'], 'urgent', 'emergency', ({ urinary, rightNow }) =>
    urinary.weakStreamOrStraining || rightNow.cannotPassUrine,
  TRIAGE_SOURCES.flareUrinary),
  flareRule('flare-watch-tingling', ['right-now-numbness', 'tingling-or-numbness', 'spinal-pain-neurological'], 'urgent', 'emergency', ({ pain, rightNow }) =>
    pain.tinglingOrNumbness || rightNow.newNumbness),

  // Risk factors on his record (nurses and clinicians set them).
  riskRule('spinalMetastases', [...PAIN_RULES, ...NEUROLOGICAL_RULES], 'emergency',
    TRIAGE_SOURCES.riskSpinalMetastases),
  riskRule('urinaryObstruction', URINARY_RULES, 'emergency',
    TRIAGE_SOURCES.riskUrinaryObstruction),
  riskRule('diabetes', SUGAR_RULES, 'urgent',
    TRIAGE_SOURCES.riskDiabetes),
  riskRule('heartDisease', HEART_RULES, 'emergency',
    TRIAGE_SOURCES.riskHeartDisease),
  riskRule('longQt', RHYTHM_RULES, 'emergency',
    TRIAGE_SOURCES.riskLongQt),
  riskRule('seizures', MIND_AND_HEADACHE_RULES, 'emergency',
    TRIAGE_SOURCES.riskSeizures),
  riskRule('chemotherapy', INFECTION_RULES, 'emergency', TRIAGE_SOURCES.riskChemotherapy),
]

export interface TriageTargets {
  /** Urgent: a nurse responds within this many hours (clinic setting). */
  urgentHours?: number
  /** Routine: within this many working days, Monday to Friday (clinic setting). */
  routineWorkingDays?: number
}

export interface TriageContext {
  flareWatchActive: boolean
  /**
   * His previous complete entries, most recent first; the first (his last report) is the
   * baseline. Entries stored by an older diary (without the areas added later) are read
   * with those areas as "no".
   */
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

function reasonOf(rule: RuleCommon, level: TriageLevel, raisedBy?: RaisedBy, riskFactor?: RiskFactor): TriageReason {
  const reason: TriageReason = {
    rule: rule.id,
    level,
    reasonKey: rule.reasonKey,
    instructionKey: rule.instructionKey,
    source: rule.source,
  }
  if (raisedBy) reason.raisedBy = raisedBy
  if (riskFactor) reason.riskFactor = riskFactor
  return reason
}

export function evaluateTriage(entry: DiaryEntryInput, context: TriageContext): TriageResult {
  const ruleContext: RuleContext = {
    flareWatchActive: context.flareWatchActive,
    baseline: baselineOf(context.baseline),
  }
  if (context.riskProfile) ruleContext.riskProfile = context.riskProfile

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
    const raised = higher(symptomLevel, lower(higher(oneStepUp(symptomLevel), rule.atLeast), rule.atMost))
    reasons.push(reasonOf(rule, raised, rule.raisedBy, rule.riskFactor))
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
