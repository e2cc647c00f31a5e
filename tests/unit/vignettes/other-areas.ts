import type { Vignette } from './vignette'

/*
 * Falls, rash and hives, confusion and drowsiness, headache, mood, fatigue, the injection
 * site, hot flushes and the free-text note.
 */
export const OTHER_VIGNETTES: Vignette[] = [
  // Falls: GnRH-agonist PI Warnings/Adverse reactions: loss of bone density (fracture risk on long-term ADT).
  {
    id: 'FALL-01',
    story: '79, 6-month depot for five years, slipped in the bathroom, got up unhurt',
    entry: { falls: { any: true } },
    minimum: 'routine',
    source: 'GnRH-agonist PI: bone density loss on long-term therapy; common practice: every fall in an older man on ADT is reviewed (falls and bone health)',
  },
  {
    id: 'FALL-02',
    story: '82, 3-month depot, fell on the path and hit his head on the step',
    entry: { falls: { any: true, hitHeadOrHurt: true } },
    minimum: 'urgent',
    source: 'common practice: head injury or hurt after a fall at 65+ is assessed the same day (NICE NG232 head injury, from memory)',
  },
  {
    id: 'FALL-03',
    story: '77, 3-month depot, fell on his hip on Saturday and cannot put weight on that leg',
    entry: { falls: { any: true, cannotBearWeight: true } },
    minimum: 'urgent',
    source: 'GnRH-agonist PI: bone density loss (fracture); common practice: suspected hip fracture, same day at least',
    why: 'an emergency visit is likely right; urgent is the floor since he may already have been seen',
  },
  {
    id: 'FALL-04',
    story: '80, 3-month depot, fell, hit his head, and his wife says he has been muddled since',
    entry: { falls: { any: true, hitHeadOrHurt: true }, mind: { any: true, confusedOrHardToWake: true } },
    minimum: 'emergency',
    source: 'common practice: head injury with altered mental state is emergency care (NICE NG232, from memory)',
    parts: [
      { label: 'fall with head hit alone', entry: { falls: { any: true, hitHeadOrHurt: true } }, minimum: 'urgent' },
      { label: 'confusion alone', entry: { mind: { any: true, confusedOrHardToWake: true } }, minimum: 'urgent' },
    ],
  },
  {
    id: 'FALL-05',
    story: '75, 1-month depot, blacked out and fell, unhurt',
    entry: { falls: { any: true }, heart: { fainting: true } },
    minimum: 'urgent',
    source: 'GnRH-agonist PI Warnings: QT prolongation, cardiovascular; common practice: syncope with a fall, same day',
  },

  // Rash and hives: GnRH-agonist PI Warnings: hypersensitivity (anaphylaxis reported).
  {
    id: 'ALG-01',
    story: '70, 3-month depot given four days ago, itchy red rash on his chest',
    entry: { allergy: { any: true } },
    minimum: 'routine',
    source: 'GnRH-agonist PI Warnings: hypersensitivity; CTCAE v5.0 rash grade 1; common practice',
  },
  {
    id: 'ALG-02',
    story: '73, 1-month depot given yesterday, hives spreading over his body and puffy eyes',
    entry: { allergy: { any: true, spreading: true } },
    minimum: 'urgent',
    source: 'GnRH-agonist PI Warnings: hypersensitivity (angioedema); common practice, same day',
  },
  {
    id: 'ALG-03',
    story: '68, 3-month depot given this morning, spreading hives and he fainted in the car park',
    entry: { allergy: { any: true, spreading: true }, heart: { fainting: true } },
    minimum: 'emergency',
    source: 'GnRH-agonist PI Warnings: hypersensitivity (anaphylaxis); skin signs with collapse meet anaphylaxis criteria (WAO 2020, from memory)',
    parts: [
      { label: 'spreading hives alone', entry: { allergy: { any: true, spreading: true } }, minimum: 'urgent' },
      { label: 'fainting alone', entry: { heart: { fainting: true } }, minimum: 'urgent' },
    ],
  },

  // Confusion and drowsiness.
  {
    id: 'MIND-01',
    story: '78, 6-month depot, bone metastases, his son says he is muddled and hard to wake this week',
    entry: { mind: { any: true, confusedOrHardToWake: true } },
    minimum: 'urgent',
    source: 'common practice: new confusion or drowsiness in advanced prostate cancer (hypercalcaemia, infection, brain metastases), same day (NICE CG103 delirium, from memory)',
  },
  {
    id: 'MIND-02',
    story: '72, 3-month depot, more forgetful and cannot concentrate on the paper',
    entry: { mind: { any: true, memoryOrConcentration: true } },
    minimum: 'routine',
    source: 'GnRH-agonist PI Adverse reactions: memory impairment reported (from memory); common practice',
  },
  {
    id: 'MIND-03',
    story: '76, 3-month depot, his wife ticked "muddled or drowsy", no details',
    entry: { mind: { any: true } },
    minimum: 'routine',
    source: 'common practice: a yes to new confusion or drowsiness is read by a nurse',
  },
  {
    id: 'MIND-04',
    story: '74, 3-month depot, insulin, muddled this morning and his meter read 45 mg/dL',
    entry: { mind: { any: true, confusedOrHardToWake: true }, sugar: { lowSugarSigns: true, glucose: { unit: 'mg/dL', value: 45 } } },
    risk: { diabetes: true },
    minimum: 'emergency',
    source: 'ADA Standards of Care 2025 s6: level 3 hypoglycaemia is low sugar with altered mental state',
  },
  {
    id: 'MIND-05',
    story: '70, 6-month depot, epilepsy on his record, drowsy and muddled since Tuesday',
    entry: { mind: { any: true, confusedOrHardToWake: true } },
    risk: { seizures: true },
    minimum: 'emergency',
    source: 'GnRH-agonist PI Warnings: convulsions; common practice: new drowsiness in a man with seizures may follow an unwitnessed fit',
  },
  {
    id: 'MIND-06',
    story: '81, 3-month depot, bone metastases, very thirsty, constipated all week and muddled',
    entry: { mind: { any: true, confusedOrHardToWake: true }, sugar: { veryThirsty: true }, bowel: { any: true, constipation: 'persistent' } },
    minimum: 'urgent',
    source: 'common practice: thirst, constipation and confusion with bone metastases suggest hypercalcaemia of malignancy, same-day blood test at least',
  },

  // Headache.
  {
    id: 'HEAD-01',
    story: '71, 3-month depot, a new kind of headache most days this week',
    entry: { headache: { any: true } },
    minimum: 'routine',
    source: 'common practice: a new headache pattern in cancer is reviewed',
  },
  {
    id: 'HEAD-02',
    story: '69, 1-month depot, sudden worst-ever headache while watching television',
    entry: { headache: { any: true, suddenSevere: true } },
    minimum: 'emergency',
    source: 'common practice: a thunderclap headache is assessed at once (NICE CKS headache red flags, from memory)',
  },
  {
    id: 'HEAD-03',
    story: '73, 1-month depot, day 6 after his first injection, sudden severe headache and now double vision',
    entry: { headache: { any: true, suddenSevere: true, visionOrVomiting: true } },
    flareWatch: true,
    minimum: 'emergency',
    source: 'GnRH-agonist PI (post-marketing): pituitary apoplexy, sudden headache, vomiting and visual change, mostly within two weeks of the first dose (from memory)',
  },
  {
    id: 'HEAD-04',
    story: '77, 3-month depot, new headache with vomiting each morning',
    entry: { headache: { any: true, visionOrVomiting: true } },
    minimum: 'urgent',
    source: 'common practice: headache with vomiting or visual change (raised intracranial pressure, brain metastases), same day',
  },

  // Mood: PHQ-2, Kroenke 2003: total 0-6, 3 or more positive.
  {
    id: 'MOOD-01',
    story: '66, 3-month depot, little interest in anything (2) and feeling down (1): PHQ-2 = 3',
    entry: { mood: { phq2Interest: 2, phq2Down: 1 } },
    minimum: 'routine',
    source: 'Kroenke 2003: PHQ-2 of 3 or more is a positive screen (boundary)',
  },
  {
    id: 'MOOD-02',
    story: '72, 6-month depot, nearly every day no interest and hopeless: PHQ-2 = 6, no self-harm thoughts',
    entry: { mood: { phq2Interest: 3, phq2Down: 3 } },
    minimum: 'routine',
    source: 'Kroenke 2003: PHQ-2 positive',
  },
  {
    id: 'MOOD-03',
    story: '68, 3-month depot, PHQ-2 = 2 this week, 0 every week before',
    entry: { mood: { phq2Interest: 1, phq2Down: 1 } },
    baseline: [{}, {}, {}],
    minimum: 'routine',
    source: 'Basch 2016/PRO-TECT alert rule: worse by 2 or more points since the last report (from memory)',
    why: 'below the PHQ-2 cut-off, but a 2-point rise from nothing is the trials\' worsening alert',
  },

  // Fatigue: CTCAE v5.0 (1 relieved by rest, 2 limits instrumental ADL, 3 limits self-care).
  {
    id: 'FAT-01',
    story: '83, 6-month depot, so tired he cannot wash or dress without help',
    entry: { fatigue: 'limits-self-care' },
    minimum: 'routine',
    source: 'CTCAE v5.0 fatigue grade 3; Basch 2016/PRO-TECT alert rule: severe (from memory)',
  },
  {
    id: 'FAT-02',
    story: '70, 3-month depot, tiredness now stops his usual shopping, none last week',
    entry: { fatigue: 'limits-usual-activities' },
    baseline: [{ fatigue: 'none' }],
    minimum: 'routine',
    source: 'CTCAE v5.0 fatigue grade 0 to 2; Basch 2016/PRO-TECT alert rule: worse by 2 or more (from memory)',
  },

  // Injection site: CTCAE v5.0 (1 tenderness, redness; 2 pain, swelling; 3 ulceration, necrosis).
  {
    id: 'INJ-01',
    story: '74, 3-month depot in the left buttock a week ago, now hot, red, spreading and oozing',
    entry: { injectionSite: { pain: true, redness: true, swelling: true, feverOrSpreadingRednessOrPus: true } },
    minimum: 'urgent',
    source: 'common practice: spreading redness or pus at the site (abscess, cellulitis) is seen the same day; CTCAE v5.0 injection site grade 3 (from memory)',
  },
  {
    id: 'INJ-02',
    story: '71, 1-month depot in the thigh, sore, red and swollen at the site for four days',
    entry: { injectionSite: { pain: true, redness: true, swelling: true } },
    minimum: 'routine',
    source: 'CTCAE v5.0 injection site reaction grade 2 (pain, swelling); common practice',
  },
  {
    id: 'INJ-03',
    story: '76, 3-month depot, site spreading red and he has a temperature of 38.4 °C',
    entry: { injectionSite: { redness: true, feverOrSpreadingRednessOrPus: true }, infection: { any: true, temperature: { unit: '°C', value: 38.4 } } },
    minimum: 'urgent',
    source: 'common practice: cellulitis with fever, same day at least',
  },

  {
    id: 'INJ-04',
    story: '68, 1-month depot, a hard, sore lump at last month\'s thigh site, bigger this week',
    entry: { injectionSite: { pain: true, lump: true } },
    minimum: 'routine',
    source: 'CTCAE v5.0 injection site reaction grade 2 (pain, induration); common practice: a growing lump is looked at',
  },

  // Hot flushes: CTCAE v5.0 (3 severe, limits self-care); Sloan 2001 score.
  {
    id: 'HOT-01',
    story: '67, 3-month depot, 12 severe flushes a day, cannot get dressed for sweating',
    entry: { hotFlushes: { perDay: 12, worstSeverity: 'severe', interference: 'self-care' } },
    minimum: 'routine',
    source: 'CTCAE v5.0 hot flashes grade 3 (limits self-care); Basch 2016/PRO-TECT alert rule: severe (from memory)',
  },
  {
    id: 'HOT-02',
    story: '70, 6-month depot, 20 very severe flushes a day, soaking the bed, stop him washing',
    entry: { hotFlushes: { perDay: 20, worstSeverity: 'very-severe', interference: 'self-care' } },
    minimum: 'routine',
    source: 'CTCAE v5.0 hot flashes grade 3; Sloan 2001 score 20 x 4 = 80',
  },
  {
    id: 'HOT-03',
    story: '65, 1-month depot, flushes from 2 mild a day last week to 10 severe a day getting in the way of his work',
    entry: { hotFlushes: { perDay: 10, worstSeverity: 'severe', interference: 'usual-activities' } },
    baseline: [{ hotFlushes: { perDay: 2, worstSeverity: 'mild', interference: 'none' } }],
    minimum: 'routine',
    source: 'Basch 2016/PRO-TECT alert rule: worse by 2 or more since the last report (from memory); Sloan 2001 score 2 -> 30',
  },

  // The note: every note is read by a person (issue 9; contract: rule note-to-read, routine).
  {
    id: 'NOTE-01',
    story: '76, 3-month depot, everything answered no, note: "my legs gave way on the stairs last night"',
    entry: { note: 'my legs gave way on the stairs last night' },
    minimum: 'routine',
    source: 'issue 9: a note must reach a person; clinically possible leg weakness (NICE NG234), so at least routine',
  },
  {
    id: 'NOTE-02',
    story: '72, 6-month depot, nothing ticked, note: "Could someone ring me about my next appointment? I am away that week."',
    entry: { note: 'Could someone ring me about my next appointment? I am away that week.' },
    minimum: 'routine',
    source: 'issue 9 / common practice: every note is read by a person',
  },
  {
    id: 'NOTE-03',
    story: '80, 3-month depot, written by his wife: "He has not been himself, sleeping most of the day"',
    entry: { note: 'He has not been himself, sleeping most of the day' },
    baseline: [{}, {}],
    minimum: 'routine',
    source: 'issue 9: a note is read by a person, whatever the quiet history',
  },
  {
    id: 'FALL-06',
    story: '81, 6-month depot, answered no to the falls question, but "cannot bear weight" stayed yes',
    entry: { falls: { any: false, cannotBearWeight: true } },
    minimum: 'urgent',
    source: 'GnRH-agonist PI: bone density loss (fracture); the schema says triage reads the details whatever the screening answer',
  },
  {
    id: 'HEAD-05',
    story: '70, 6-month depot for three years (no flare), sudden severe headache and lost vision in one eye',
    entry: { headache: { any: true, suddenSevere: true, visionOrVomiting: true } },
    minimum: 'emergency',
    source: 'common practice: thunderclap headache with visual loss (haemorrhage, stroke, apoplexy), emergency care',
  },
]
