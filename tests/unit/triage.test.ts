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
} from '../../shared/clinical/triage'
import type { TriageContext, TriageLevel } from '../../shared/clinical/triage'
import { addDays, flareWatch } from '../../shared/clinical/schedule'
import { emptyDiaryEntry } from '../../shared/schemas/diary'
import type { DiaryEntryInput } from '../../shared/schemas/diary'

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

interface RuleCase {
  source: string
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
    source: 'Serlin 1995', level: 'urgent',
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
    source: 'Basch 2016; 3 points from memory', level: 'routine',
    // Median of four entries at 2 is 2: 5 is 3 points up, 4 only 2.
    fires: entryWith(painOf(5, 'hips')),
    misses: entryWith(painOf(4, 'hips')),
    context: { baseline: steadyBaseline(painOf(2, 'hips')) },
  },
  'baseline-hot-flushes': {
    source: 'Basch 2016; 2 grades from memory', level: 'urgent',
    // Grade 0 to grade 2 (routine on its own) is raised to urgent; grade 1 is not 2 up.
    fires: entryWith(e => (e.hotFlushes = { perDay: 6, worstSeverity: 'moderate', interference: 'usual-activities' })),
    misses: entryWith(e => (e.hotFlushes = { perDay: 6, worstSeverity: 'moderate', interference: 'none' })),
    context: { baseline: steadyBaseline() },
  },
  'baseline-fatigue': {
    source: 'Basch 2016; 2 grades from memory', level: 'urgent',
    fires: entryWith(e => (e.fatigue = 'limits-usual-activities')),
    misses: entryWith(e => (e.fatigue = 'limits-usual-activities')),
    context: { baseline: steadyBaseline() },
    missContext: { baseline: steadyBaseline(e => (e.fatigue = 'eased-by-rest')) },
  },
  'baseline-injection-site': {
    source: 'Basch 2016; 2 grades from memory', level: 'urgent',
    fires: entryWith(e => (e.injectionSite.pain = true)),
    misses: entryWith(e => (e.injectionSite.redness = true)),
    context: { baseline: steadyBaseline() },
  },
  'flare-watch-bone-pain': {
    source: 'prescribing information Warnings; NICE NG234', level: 'urgent',
    fires: entryWith(painOf(4, 'hips'), newOrWorse),
    misses: entryWith(painOf(3, 'hips'), newOrWorse),
    context: { flareWatchActive: true },
  },
  'flare-watch-urinary': {
    source: 'prescribing information Warnings', level: 'urgent',
    fires: entryWith(weakStream),
    misses: entryWith(weakStream),
    context: { flareWatchActive: true },
    missContext: { flareWatchActive: false },
  },
  'flare-watch-tingling': {
    source: 'prescribing information Warnings; NICE NG234', level: 'urgent',
    fires: entryWith(tingling),
    misses: entryWith(tingling, weakStream),
    context: { flareWatchActive: true },
    missContext: { flareWatchActive: false },
  },
}

const ALL_RULES = [...TRIAGE_RULES, ...RAISE_RULES]

describe('the rule tables', () => {
  it('every rule has a firing case and a near-miss case below', () => {
    expect(Object.keys(CASES).sort()).toEqual(ALL_RULES.map(rule => rule.id).sort())
  })

  it('ids are unique and each rule names a source and its locale keys', () => {
    expect(new Set(ALL_RULES.map(rule => rule.id)).size).toBe(ALL_RULES.length)
    for (const rule of ALL_RULES) {
      expect(rule.source.length, rule.id).toBeGreaterThan(10)
      expect(rule.reasonKey).toBe(`triage.rules.${rule.id}.reason`)
      expect(rule.instructionKey).toBe(`triage.rules.${rule.id}.instruction`)
    }
  })

  it('raise rules point at fixed rules that exist', () => {
    const fixedIds = TRIAGE_RULES.map(rule => rule.id)
    for (const rule of RAISE_RULES) {
      for (const id of rule.symptomRules) expect(fixedIds, rule.id).toContain(id)
    }
  })

  it('baseline raises stop at urgent; flare-watch raises start at urgent', () => {
    for (const rule of RAISE_RULES) {
      if (rule.raisedBy === 'baseline') expect(rule).toMatchObject({ atLeast: 'none', atMost: 'urgent' })
      else expect(rule).toMatchObject({ atLeast: 'urgent', atMost: 'emergency' })
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
  })

  it('just misses', () => {
    expect(firedRules(ruleCase.misses, ruleCase.missContext ?? ruleCase.context)).not.toContain(id)
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

describe('worse than his own baseline (Basch 2016; thresholds from memory)', () => {
  it('uses the median of the four most recent entries only', () => {
    // Most recent first: 8, 8, 1, 1 -> median 4.5; the older 1 is ignored (all five: median 1).
    const previous = [8, 8, 1, 1, 1].map(worst => entryWith(painOf(worst, 'hips')))
    expect(baselineOf(previous)?.pain).toBe((1 + 8) / 2)
    expect(firedRules(entryWith(painOf(7, 'hips')), { baseline: previous })).not.toContain('baseline-pain')
    expect(firedRules(entryWith(painOf(7, 'hips')), { baseline: previous.slice(2) })).toContain('baseline-pain')
  })

  it('takes the middle of two values when there are only two entries', () => {
    const previous = [1, 2].map(worst => entryWith(painOf(worst, 'hips')))
    expect(baselineOf(previous)?.pain).toBe(1.5)
    expect(firedRules(entryWith(painOf(4, 'hips')), { baseline: previous })).not.toContain('baseline-pain')
    expect(firedRules(entryWith(painOf(5, 'hips')), { baseline: previous })).toContain('baseline-pain')
  })

  it('has no baseline before his first entry', () => {
    expect(baselineOf([])).toBeNull()
    expect(triage(entryWith(painOf(6, 'hips'))).level).toBe('none')
  })

  it('raises one step: pain 2 -> 5 in the hips goes from none to routine, marked as baseline', () => {
    const result = triage(entryWith(painOf(5, 'hips')), { baseline: steadyBaseline(painOf(2, 'hips')) })
    expect(result.level).toBe('routine')
    expect(result.reasons).toEqual([expect.objectContaining({ rule: 'baseline-pain', level: 'routine', raisedBy: 'baseline' })])
  })

  it('raises at most to urgent: pain 1 -> 9 new in the hips stays urgent', () => {
    const result = triage(entryWith(painOf(9, 'hips'), newOrWorse), { baseline: steadyBaseline(painOf(1, 'hips')) })
    expect(result.level).toBe('urgent')
    expect(result.reasons.find(r => r.rule === 'baseline-pain')?.level).toBe('urgent')
  })

  it('raises the worsened symptom, not an unrelated finding beside it', () => {
    const entry = entryWith(painOf(5, 'hips'), e => (e.mood = { phq2Interest: 2, phq2Down: 2 }))
    const result = triage(entry, { baseline: steadyBaseline(painOf(2, 'hips')) })
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
    ])
    const dayAfter = triage(entry, contextOn(addDays(lastDay, 1)))
    expect(dayAfter.level).toBe('none')
    expect(dayAfter.reasons).toEqual([])
  })

  it('counts pain with no place ticked as possible bone pain, but not pain only in "other" places', () => {
    expect(firedRules(entryWith(painOf(5), newOrWorse), { flareWatchActive: true })).toContain('flare-watch-bone-pain')
    expect(firedRules(entryWith(painOf(5, 'other'), newOrWorse), { flareWatchActive: true })).not.toContain('flare-watch-bone-pain')
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
    expect(result.reasons.map(r => r.raisedBy).sort()).toEqual(['baseline', 'flare-watch'])
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
