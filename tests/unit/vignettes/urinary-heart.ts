import type { Vignette } from './vignette'

/*
 * Urinary (IPSS: Barry 1992, mild 0-7, moderate 8-19, severe 20-35) and heart and
 * circulation. The GnRH-agonist PI Warnings name urinary tract obstruction in the flare,
 * and cardiovascular disease (myocardial infarction, sudden cardiac death, stroke) and QT
 * prolongation on therapy.
 */
export const URINARY_VIGNETTES: Vignette[] = [
  {
    id: 'URI-01',
    story: '76, 3-month depot, pink urine twice this week, no pain',
    entry: { urinary: { blood: true } },
    minimum: 'routine',
    source: 'CTCAE v5.0 haematuria; common practice: visible blood in the urine is reviewed by a nurse',
  },
  {
    id: 'URI-02',
    story: '70, 1-month depot, burning when he passes water since Monday, no fever',
    entry: { urinary: { burning: true } },
    minimum: 'routine',
    source: 'common practice: a possible urine infection needs a nurse to arrange a urine test',
  },
  {
    id: 'URI-03',
    story: '79, 6-month depot, weaker stream and has to strain, first time he mentions it',
    entry: { urinary: { weakStreamOrStraining: true } },
    minimum: 'routine',
    source: 'common practice: new outflow symptoms in prostate cancer are reviewed',
  },
  {
    id: 'URI-04',
    story: '73, 3-month depot, IPSS 24 this month (severe)',
    entry: { urinary: { ipss: { items: [4, 4, 3, 4, 4, 2, 3], qualityOfLife: 4 } } },
    minimum: 'routine',
    source: 'Barry 1992: IPSS 20-35 severe',
  },
  {
    id: 'URI-05',
    story: '81, 3-month depot, IPSS exactly 20 (the first severe score)',
    entry: { urinary: { ipss: { items: [3, 3, 3, 3, 3, 2, 3], qualityOfLife: 3 } } },
    minimum: 'routine',
    source: 'Barry 1992: IPSS 20 is severe (boundary)',
  },
  {
    id: 'URI-06',
    story: '68, 1-month depot, IPSS 35, every item as bad as it can be',
    entry: { urinary: { weakStreamOrStraining: true, ipss: { items: [5, 5, 5, 5, 5, 5, 5], qualityOfLife: 6 } } },
    minimum: 'routine',
    source: 'Barry 1992: IPSS severe',
  },
  {
    id: 'URI-07',
    story: '74, 3-month depot, IPSS 15 (moderate) this month, 5 (mild) last month',
    entry: { urinary: { ipss: { items: [2, 3, 2, 2, 3, 1, 2], qualityOfLife: 3 } } },
    baseline: [{ urinary: { ipss: { items: [1, 1, 0, 1, 1, 0, 1], qualityOfLife: 1 } } }],
    minimum: 'routine',
    source: 'Barry 1992 bands (mild to moderate); a 10-point rise is far beyond the ~3-point change men notice (Barry 1995, from memory); common practice',
  },
  {
    id: 'URI-08',
    story: '77, 1-month depot, day 10 after his first injection, IPSS 22',
    entry: { urinary: { weakStreamOrStraining: true, ipss: { items: [4, 3, 3, 3, 4, 2, 3], qualityOfLife: 5 } } },
    flareWatch: true,
    minimum: 'urgent',
    source: 'GnRH-agonist PI Warnings: tumour flare, urinary tract obstruction (watch closely in the first weeks); Barry 1992 severe',
  },
  {
    id: 'URI-09',
    story: '72, 3-month depot, blood in his urine, burning, and the stream is weak and he strains',
    entry: { urinary: { blood: true, burning: true, weakStreamOrStraining: true } },
    minimum: 'urgent',
    source: 'common practice: haematuria with outflow obstruction risks clot retention, same day',
    parts: [
      { label: 'blood alone', entry: { urinary: { blood: true } }, minimum: 'routine' },
      { label: 'weak stream alone', entry: { urinary: { weakStreamOrStraining: true } }, minimum: 'routine' },
    ],
  },
]

export const HEART_VIGNETTES: Vignette[] = [
  {
    id: 'HRT-01',
    story: '78, 3-month depot, fainted in the kitchen on Wednesday, came round at once',
    entry: { heart: { fainting: true } },
    minimum: 'urgent',
    source: 'GnRH-agonist PI Warnings: QT prolongation, cardiovascular; common practice: syncope on ADT is assessed the same day (ECG)',
  },
  {
    id: 'HRT-02',
    story: '70, 1-month depot, heart racing and fluttering on and off this week, otherwise well',
    entry: { heart: { racingOrIrregular: true } },
    minimum: 'routine',
    source: 'GnRH-agonist PI Warnings: QT prolongation; common practice (new palpitations, ECG)',
  },
  {
    id: 'HRT-03',
    story: '83, 6-month depot, both ankles swollen by evening this week',
    entry: { heart: { legSwelling: true } },
    minimum: 'routine',
    source: 'GnRH-agonist PI Adverse reactions: peripheral oedema; common practice',
  },
  {
    id: 'HRT-04',
    story: '75, 3-month depot, out of breath walking to the letterbox, new this month',
    entry: { heart: { breathlessLightEffort: true } },
    minimum: 'routine',
    source: 'GnRH-agonist PI Warnings: cardiovascular; common practice (anaemia on ADT, heart failure)',
  },
  {
    id: 'HRT-05',
    story: '71, 3-month depot, right calf hot, red, swollen and sore since Saturday',
    entry: { heart: { oneLegPainfulSwollen: true } },
    minimum: 'urgent',
    source: 'common practice: suspected deep vein thrombosis (cancer and ADT raise VTE risk) is assessed the same day (NICE NG158, from memory)',
  },
  {
    id: 'HRT-06',
    story: '76, 3-month depot, fainted twice this week and his heart was racing just before',
    entry: { heart: { fainting: true, racingOrIrregular: true } },
    minimum: 'emergency',
    source: 'GnRH-agonist PI Warnings: QT prolongation (torsades); palpitations before syncope is a high-risk arrhythmic feature (ESC 2018 syncope guideline, from memory)',
    parts: [
      { label: 'fainting alone', entry: { heart: { fainting: true } }, minimum: 'urgent' },
      { label: 'racing alone', entry: { heart: { racingOrIrregular: true } }, minimum: 'routine' },
    ],
  },
  {
    id: 'HRT-07',
    story: '72, 4-month depot, heart racing and out of breath after a few steps',
    entry: { heart: { racingOrIrregular: true, breathlessLightEffort: true } },
    minimum: 'urgent',
    source: 'common practice: a fast or irregular heart with breathlessness (new AF with heart failure) is seen the same day',
    parts: [
      { label: 'racing alone', entry: { heart: { racingOrIrregular: true } }, minimum: 'routine' },
      { label: 'breathless alone', entry: { heart: { breathlessLightEffort: true } }, minimum: 'routine' },
    ],
  },
  {
    id: 'HRT-08',
    story: '80, 6-month depot, ankles swollen and breathless on the stairs, both new',
    entry: { heart: { legSwelling: true, breathlessLightEffort: true } },
    minimum: 'urgent',
    source: 'common practice: oedema with breathlessness suggests heart failure, same day; GnRH-agonist PI Warnings: cardiovascular',
    parts: [
      { label: 'swelling alone', entry: { heart: { legSwelling: true } }, minimum: 'routine' },
      { label: 'breathless alone', entry: { heart: { breathlessLightEffort: true } }, minimum: 'routine' },
    ],
  },
  {
    id: 'HRT-09',
    story: '69, 1-month depot, left calf painful and swollen, and now breathless walking across the room',
    entry: { heart: { oneLegPainfulSwollen: true, breathlessLightEffort: true } },
    minimum: 'emergency',
    source: 'common practice: a suspected DVT with new breathlessness is a possible pulmonary embolism, emergency care now (NICE NG158, from memory)',
    parts: [
      { label: 'one leg alone', entry: { heart: { oneLegPainfulSwollen: true } }, minimum: 'urgent' },
      { label: 'breathless alone', entry: { heart: { breathlessLightEffort: true } }, minimum: 'routine' },
    ],
  },
  {
    id: 'HRT-10',
    story: '74, 3-month depot, swollen painful right leg and heart racing',
    entry: { heart: { oneLegPainfulSwollen: true, racingOrIrregular: true } },
    minimum: 'emergency',
    source: 'common practice: DVT signs with tachycardia, possible pulmonary embolism (Wells criteria, from memory)',
    parts: [
      { label: 'one leg alone', entry: { heart: { oneLegPainfulSwollen: true } }, minimum: 'urgent' },
      { label: 'racing alone', entry: { heart: { racingOrIrregular: true } }, minimum: 'routine' },
    ],
  },
  {
    id: 'HRT-11',
    story: '84, 6-month depot, fainted, heart racing, ankles swollen and breathless: all four this week',
    entry: { heart: { fainting: true, racingOrIrregular: true, legSwelling: true, breathlessLightEffort: true } },
    minimum: 'emergency',
    source: 'GnRH-agonist PI Warnings: cardiovascular, QT prolongation; common practice',
  },
  {
    id: 'HRT-12',
    story: '73, 3-month depot, racing heart, swollen ankles and breathless on light effort, no fainting',
    entry: { heart: { racingOrIrregular: true, legSwelling: true, breathlessLightEffort: true } },
    minimum: 'urgent',
    source: 'common practice: three heart-failure or arrhythmia signs together, same day at least',
  },
]
