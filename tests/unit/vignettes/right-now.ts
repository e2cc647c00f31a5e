import type { Vignette } from './vignette'

/*
 * The right-now check: each item alone is a call to the emergency number now. Sources per
 * item; the right-now check alone must always give emergency (issue 9).
 */
export const RIGHT_NOW_VIGNETTES: Vignette[] = [
  {
    id: 'RN-01',
    story: '71, 1-month depot for three years, his right leg has felt weak since this morning',
    entry: { rightNow: { newWeakness: true } },
    minimum: 'emergency',
    source: 'NICE NG234 (2023): new limb weakness is an immediate referral (suspected MSCC)',
  },
  {
    id: 'RN-02',
    story: '68, 3-month depot, known bone metastases, numb from the waist down since last night',
    entry: { rightNow: { newNumbness: true } },
    minimum: 'emergency',
    source: 'NICE NG234 (2023): numbness or sensory loss, immediate',
  },
  {
    id: 'RN-03',
    story: '80, 6-month depot, dragging his feet since Sunday and needs the wall to walk',
    entry: { rightNow: { troubleWalking: true } },
    minimum: 'emergency',
    source: 'NICE NG234 (2023): difficulty walking, immediate',
  },
  {
    id: 'RN-04',
    story: '76, 3-month depot, wet himself twice yesterday without feeling it coming',
    entry: { rightNow: { bladderBowelControl: true } },
    minimum: 'emergency',
    source: 'NICE NG234 (2023): new bladder or bowel control problems, immediate',
  },
  {
    id: 'RN-05',
    story: '73, 1-month depot, day 9 after his first injection, has not passed urine since last night and his belly is tight',
    entry: { rightNow: { cannotPassUrine: true } },
    flareWatch: true,
    minimum: 'emergency',
    source: 'GnRH-agonist PI Warnings: tumour flare (urinary tract obstruction); acute urinary retention needs a catheter the same hour (common practice)',
  },
  {
    id: 'RN-06',
    story: '69, 4-month depot, heavy chest pain when he climbed the stairs an hour ago, still there',
    entry: { rightNow: { chestPain: true } },
    minimum: 'emergency',
    source: 'GnRH-agonist PI Warnings: cardiovascular (myocardial infarction, sudden cardiac death); common practice',
  },
  {
    id: 'RN-07',
    story: '82, 3-month depot, his daughter reports he is struggling to breathe sitting still',
    entry: { rightNow: { hardToBreathe: true } },
    minimum: 'emergency',
    source: 'common practice (breathless at rest); GnRH-agonist PI Warnings: cardiovascular, hypersensitivity',
  },
  {
    id: 'RN-08',
    story: '77, 6-month depot, his wife saw one side of his face drop and his words come out slurred',
    entry: { rightNow: { faceDroopSpeech: true } },
    minimum: 'emergency',
    source: 'GnRH-agonist PI Warnings: cardiovascular (stroke); common practice (face, arm, speech: call now)',
  },
  {
    id: 'RN-09',
    story: '66, 1-month depot, first ever fit at breakfast, no history of epilepsy',
    entry: { rightNow: { seizure: true } },
    minimum: 'emergency',
    source: 'GnRH-agonist PI Warnings: convulsions',
  },
  {
    id: 'RN-10',
    story: '72, 3-month depot given this afternoon, lips and throat swelling up',
    entry: { rightNow: { faceThroatSwelling: true } },
    minimum: 'emergency',
    source: 'GnRH-agonist PI Warnings: hypersensitivity (anaphylaxis, angioedema)',
  },
  {
    id: 'RN-11',
    story: '64, 3-month depot, lives alone, keeps thinking he would be better off dead',
    entry: { rightNow: { selfHarmThoughts: true } },
    minimum: 'emergency',
    source: 'REFERENCES.md PHQ-2: any thought of self-harm is an emergency instruction whatever the score (Kroenke 2003)',
  },
  {
    id: 'RN-12',
    story: '79, 3-month depot, stable for a year (four quiet entries), today numb in both legs',
    entry: { rightNow: { newNumbness: true } },
    baseline: [{}, {}, {}, {}],
    minimum: 'emergency',
    source: 'NICE NG234 (2023): a quiet history never lowers an immediate sign',
  },
  {
    id: 'RN-13',
    story: '70, 6-month depot, self-harm thoughts but PHQ-2 items both 0 (he skipped the mood questions)',
    entry: { rightNow: { selfHarmThoughts: true }, mood: { phq2Interest: 0, phq2Down: 0 } },
    minimum: 'emergency',
    source: 'REFERENCES.md PHQ-2: self-harm thoughts are an emergency whatever the score',
  },
]
