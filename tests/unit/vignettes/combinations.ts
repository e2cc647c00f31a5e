import type { Control, Vignette } from './vignette'

/*
 * Signs that rank higher together than each alone (each part's own floor is lower than
 * the combination's), and a few realistic weeks with several things at once.
 */
export const COMBINATION_VIGNETTES: Vignette[] = [
  {
    id: 'CMB-01',
    story: '74, 3-month depot, new back ache 3/10 and constipated all week despite daily laxatives',
    entry: { pain: { worst: 3, locations: ['back'], newOrWorse: true }, bowel: { any: true, constipation: 'persistent' } },
    minimum: 'urgent',
    source: 'NICE NG234 (2023): spinal pain with a bowel change; CTCAE v5.0 constipation grade 2',
    parts: [
      { label: 'new mild back pain alone', entry: { pain: { worst: 3, locations: ['back'], newOrWorse: true } }, minimum: 'routine' },
      { label: 'persistent constipation alone', entry: { bowel: { any: true, constipation: 'persistent' } }, minimum: 'routine' },
    ],
  },
  {
    id: 'CMB-02',
    story: '81, 6-month depot, too tired to wash, out of breath on light effort and heart racing',
    entry: { fatigue: 'limits-self-care', heart: { breathlessLightEffort: true, racingOrIrregular: true } },
    minimum: 'urgent',
    source: 'common practice: severe fatigue with breathlessness and a fast heart (anaemia on ADT, heart failure), same day',
    parts: [
      { label: 'fatigue alone', entry: { fatigue: 'limits-self-care' }, minimum: 'routine' },
      { label: 'breathless alone', entry: { heart: { breathlessLightEffort: true } }, minimum: 'routine' },
    ],
  },
  {
    id: 'CMB-03',
    story: '72, 3-month depot, diabetes, meter HI 33.3 mmol/L, very thirsty, and his wife says he is muddled',
    entry: { sugar: { veryThirsty: true, urinatingMore: true, glucose: { unit: 'mmol/L', value: 33.3 } }, mind: { any: true, confusedOrHardToWake: true } },
    risk: { diabetes: true },
    minimum: 'emergency',
    source: 'common practice: very high glucose with altered mental state is a possible hyperosmolar state (ADA hyperglycaemic crises consensus, from memory)',
    parts: [
      { label: 'high sugar with symptoms alone', entry: { sugar: { veryThirsty: true, urinatingMore: true, glucose: { unit: 'mmol/L', value: 33.3 } } }, minimum: 'urgent' },
      { label: 'confusion alone', entry: { mind: { any: true, confusedOrHardToWake: true } }, minimum: 'urgent' },
    ],
  },
  {
    id: 'CMB-04',
    story: '70, 1-month depot, headache with vomiting and now drowsy and muddled',
    entry: { headache: { any: true, visionOrVomiting: true }, mind: { any: true, confusedOrHardToWake: true } },
    minimum: 'emergency',
    source: 'common practice: headache with vomiting and a falling level of consciousness (raised intracranial pressure), emergency care',
    parts: [
      { label: 'headache with vomiting alone', entry: { headache: { any: true, visionOrVomiting: true } }, minimum: 'urgent' },
      { label: 'confusion alone', entry: { mind: { any: true, confusedOrHardToWake: true } }, minimum: 'urgent' },
    ],
  },
  {
    id: 'CMB-05',
    story: '77, 3-month depot, known urinary obstruction, 38.5 °C, shaking chills and burning urine',
    entry: { infection: { any: true, temperature: { unit: '°C', value: 38.5 }, shakingChills: true }, urinary: { burning: true, weakStreamOrStraining: true } },
    risk: { urinaryObstruction: true },
    minimum: 'emergency',
    source: 'common practice: urinary infection above a known obstruction with rigors (urosepsis), emergency care',
    parts: [
      { label: 'fever with chills alone', entry: { infection: { any: true, temperature: { unit: '°C', value: 38.5 }, shakingChills: true } }, minimum: 'urgent' },
      { label: 'weak stream alone (known obstruction)', entry: { urinary: { weakStreamOrStraining: true } }, minimum: 'urgent' },
    ],
  },
  {
    id: 'CMB-06',
    story: '69, 3-month depot, five extra stools a day and 38.3 °C, no chemotherapy',
    entry: { bowel: { any: true, extraStoolsPerDay: 5 }, infection: { any: true, temperature: { unit: '°C', value: 38.3 } } },
    minimum: 'urgent',
    source: 'CTCAE v5.0 diarrhoea grade 2 and fever grade 1; common practice: infective diarrhoea with fever in an older man, same day',
    parts: [
      { label: 'diarrhoea alone', entry: { bowel: { any: true, extraStoolsPerDay: 5 } }, minimum: 'routine' },
      { label: 'fever alone', entry: { infection: { any: true, temperature: { unit: '°C', value: 38.3 } } }, minimum: 'routine' },
    ],
  },
  {
    id: 'CMB-07',
    story: '76, 1-month depot, week 3 after his first injection, new back pain 5/10, weak stream and constipated',
    entry: { pain: { worst: 5, locations: ['back'], newOrWorse: true }, urinary: { weakStreamOrStraining: true }, bowel: { any: true, constipation: 'persistent' } },
    flareWatch: true,
    minimum: 'urgent',
    source: 'GnRH-agonist PI Warnings: tumour flare (bone pain, urinary obstruction, cord compression); NICE NG234 progressive spinal pain',
  },
  {
    id: 'CMB-08',
    story: '73, 3-month depot, a week of several things: hot flushes 8 a day moderate, fatigue limits usual activities, PHQ-2 3, back pain 3/10 steady',
    entry: {
      hotFlushes: { perDay: 8, worstSeverity: 'moderate', interference: 'usual-activities' },
      fatigue: 'limits-usual-activities',
      mood: { phq2Interest: 2, phq2Down: 1 },
      pain: { worst: 3, locations: ['back'] },
    },
    baseline: [{ hotFlushes: { perDay: 8, worstSeverity: 'moderate', interference: 'usual-activities' }, fatigue: 'limits-usual-activities', pain: { worst: 3, locations: ['back'] } }],
    minimum: 'routine',
    source: 'Kroenke 2003 PHQ-2 positive',
  },
  {
    id: 'CMB-09',
    story: '79, 3-month depot, fell and cannot bear weight, known spinal metastases, back pain 8/10 new',
    entry: { falls: { any: true, hitHeadOrHurt: true, cannotBearWeight: true }, pain: { worst: 8, locations: ['back', 'hips'], newOrWorse: true } },
    risk: { spinalMetastases: true },
    minimum: 'urgent',
    source: 'NICE NG234 (2023); GnRH-agonist PI bone density loss (fracture); common practice',
  },
]

/* Negative controls: nothing to report must give exactly none. */
export const CONTROLS: Control[] = [
  {
    id: 'CTL-01',
    story: '71, 3-month depot, a quiet week: every answer no, first entry, no risk profile on record',
    entry: {},
    noRiskProfile: true,
    exactly: 'none',
    source: 'common practice: nothing to report needs no nurse action',
  },
  {
    id: 'CTL-02',
    story: '74, 6-month depot, every answer no, four quiet previous entries, no risk factors',
    entry: {},
    baseline: [{}, {}, {}, {}],
    exactly: 'none',
    source: 'common practice',
  },
  {
    id: 'CTL-03',
    story: '69, 3-month depot, a usual week on therapy: 3 mild flushes a day, tiredness eased by rest, PHQ-2 1, same as the last three weeks',
    entry: { hotFlushes: { perDay: 3, worstSeverity: 'mild', interference: 'none' }, fatigue: 'eased-by-rest', mood: { phq2Interest: 1, phq2Down: 0 } },
    baseline: [
      { hotFlushes: { perDay: 3, worstSeverity: 'mild', interference: 'none' }, fatigue: 'eased-by-rest', mood: { phq2Interest: 1, phq2Down: 0 } },
      { hotFlushes: { perDay: 4, worstSeverity: 'mild', interference: 'none' }, fatigue: 'eased-by-rest', mood: { phq2Interest: 0, phq2Down: 1 } },
      { hotFlushes: { perDay: 3, worstSeverity: 'mild', interference: 'none' }, fatigue: 'eased-by-rest', mood: { phq2Interest: 1, phq2Down: 0 } },
    ],
    exactly: 'none',
    source: 'CTCAE v5.0 grade 1 hot flashes and fatigue, PHQ-2 below 3 (Kroenke 2003), stable (Basch 2016 alert rule not met, from memory)',
  },
  {
    id: 'CTL-04',
    story: '72, 1-month depot, day 9 after his first injection (flare watch), every answer no',
    entry: {},
    flareWatch: true,
    exactly: 'none',
    source: 'common practice: the flare watch raises symptoms; with none there is nothing to raise',
  },
  {
    id: 'CTL-05',
    story: '75, 3-month depot, every risk factor on his record, every answer no',
    entry: {},
    risk: { spinalMetastases: true, urinaryObstruction: true, diabetes: true, heartDisease: true, longQt: true, seizures: true, chemotherapy: true },
    exactly: 'none',
    source: 'common practice: a risk factor raises related symptoms; with none there is nothing to raise',
  },
  {
    id: 'CTL-06',
    story: '70, 3-month depot, every answer no, normal readings (glucose 5.6 mmol/L, 36.8 °C)',
    entry: { sugar: { glucose: { unit: 'mmol/L', value: 5.6 } }, infection: { any: false, temperature: { unit: '°C', value: 36.8 } } },
    baseline: [{}],
    exactly: 'none',
    source: 'ADA Standards of Care 2025 (5.6 mmol/L = 101 mg/dL, not low, not >= 200); CTCAE v5.0 fever starts at 38.0 °C',
  },
]
