import { describe, expect, it } from 'vitest'
import { LAB_RULES, evaluateLabTriage, interpretLab } from '#shared/labs/lab-triage'
import type { LabContext, LabReading } from '#shared/labs/lab-triage'
import { labResultSchema } from '#shared/labs/schemas'

/*
 * The lab rules (clinic defaults), each checked where it fires and where it just misses,
 * with the numbers worked out again from the formulas in REFERENCES.md.
 */

let nextId = 1
const reading = (kind: LabReading['kind'], value: number, takenOn = '2025-06-02', extra: Partial<LabReading> = {}): LabReading =>
  ({ id: nextId++, kind, takenOn, value, unit: { testosterone: 'ng/dL', psa: 'ng/mL', hba1c: '%', qtc: 'ms' }[kind], heartRate: kind === 'qtc' ? 60 : null, ...extra })

const onTherapy: LabContext = { history: [], firstInjectionOn: '2025-01-06' }

function triage(result: LabReading, context: LabContext = onTherapy) {
  return evaluateLabTriage(interpretLab(result, { ...context, history: [...context.history, result] }))
}
const rulesOf = (result: ReturnType<typeof triage>) => result.reasons.map(r => r.rule)

describe('every rule', () => {
  it('names its published source, or says common practice or from memory', () => {
    for (const rule of LAB_RULES) {
      expect(rule.source, rule.id).toMatch(/(\d{4}|common practice|from memory)/)
      expect(rule.reasonKey).toBe(`labs.rules.${rule.id}.reason`)
    }
  })
})

describe('testosterone escape (Oefelein 2000; EAU, from memory): at or above 50 ng/dL on therapy -> urgent', () => {
  it('50 ng/dL fires; 49.9 ng/dL just misses', () => {
    const fired = triage(reading('testosterone', 50))
    expect(fired.level).toBe('urgent')
    expect(rulesOf(fired)).toEqual(['testosterone-escape'])
    expect(fired.reasons[0]!.source).toMatch(/Oefelein/)
    expect(triage(reading('testosterone', 49.9)).level).toBe('none')
  })

  it('in nmol/L (ng/dL = nmol/L / 0.03467): 1.74 nmol/L = 50.2 ng/dL fires; 1.73 nmol/L = 49.9 ng/dL misses', () => {
    // Worked by hand (REFERENCES.md, molar mass 288.42 g/mol): 1.74 / 0.03467 = 50.187 ng/dL,
    // at or above 50; 1.73 / 0.03467 = 49.899 ng/dL, below it.
    const above = interpretLab(reading('testosterone', 1.74, '2025-06-02', { unit: 'nmol/L' }), onTherapy)
    const below = interpretLab(reading('testosterone', 1.73, '2025-06-02', { unit: 'nmol/L' }), onTherapy)
    expect(above).toMatchObject({ kind: 'testosterone', castrate: false })
    expect(below).toMatchObject({ kind: 'testosterone', castrate: true })
    if (above.kind !== 'testosterone' || below.kind !== 'testosterone') throw new Error('kind')
    expect(above.ngPerDl).toBeCloseTo(50.187, 2)
    expect(below.ngPerDl).toBeCloseTo(49.899, 2)
    expect(triage(reading('testosterone', 1.74, '2025-06-02', { unit: 'nmol/L' })).level).toBe('urgent')
    expect(triage(reading('testosterone', 1.73, '2025-06-02', { unit: 'nmol/L' })).level).toBe('none')
  })

  it('not before therapy: no injection, or a sample in the first 28 days after the first one', () => {
    expect(triage(reading('testosterone', 420), { history: [], firstInjectionOn: null }).level).toBe('none')
    expect(triage(reading('testosterone', 420, '2025-02-02'), onTherapy).level).toBe('none') // day 27
    expect(triage(reading('testosterone', 420, '2025-02-03'), onTherapy).level).toBe('urgent') // day 28
  })

  it('shows both units and both levels: 15 ng/dL is castrate and below the stricter 20 ng/dL', () => {
    const result = interpretLab(reading('testosterone', 15), onTherapy)
    expect(result).toMatchObject({ kind: 'testosterone', castrate: true, belowStrictLevel: true, onTherapy: true })
    // 15 ng/dL x 0.03467 = 0.52005 nmol/L.
    if (result.kind === 'testosterone') expect(result.nmolPerL).toBeCloseTo(0.52005, 5)
  })
})

describe('QTc (CTCAE v5.0; grade from Fridericia QT / cbrt(60 / HR))', () => {
  it('at 60 bpm RR = 1 s, so QTc = QT: 501 ms is grade 3 -> urgent; 500 ms is grade 2 -> routine; 480 ms grade 1 -> none', () => {
    const three = triage(reading('qtc', 501))
    expect(three.level).toBe('urgent')
    expect(rulesOf(three)).toEqual(['qtc-grade-3'])
    expect(three.reasons[0]!.source).toMatch(/CTCAE v5\.0/)
    const two = triage(reading('qtc', 500))
    expect(two.level).toBe('routine')
    expect(rulesOf(two)).toEqual(['qtc-grade-2'])
    expect(triage(reading('qtc', 481)).level).toBe('routine')
    expect(triage(reading('qtc', 480)).level).toBe('none')
  })

  it('Fridericia drives the grade: QT 440 ms at 90 bpm is 440 / cbrt(0.667) = 504 ms (Bazett 539 ms) -> urgent', () => {
    // Worked by hand: RR = 60 / 90 = 0.6667 s; cbrt(0.6667) = 0.87358, 440 / 0.87358 = 503.67 ms
    // (Fridericia 1920); sqrt(0.6667) = 0.81650, 440 / 0.81650 = 538.89 ms (Bazett 1920).
    const result = interpretLab(reading('qtc', 440, '2025-06-02', { heartRate: 90 }), onTherapy)
    expect(result).toMatchObject({ kind: 'qtc', grade: 3, highRisk: true })
    if (result.kind !== 'qtc') throw new Error('kind')
    expect(result.fridericia).toBeCloseTo(503.67, 1)
    expect(result.bazett).toBeCloseTo(538.89, 1)
    expect(Math.round(result.fridericia)).toBe(504)
    expect(Math.round(result.bazett)).toBe(539)
  })

  it('a rise of more than 60 ms from his first QTc is grade 3: 420 -> 481 (+61) urgent; 421 -> 481 (+60) only grade 2', () => {
    const baseline = reading('qtc', 420, '2025-01-10')
    const rise = reading('qtc', 481)
    expect(triage(rise, { ...onTherapy, history: [baseline] }).level).toBe('urgent')
    const result = interpretLab(rise, { ...onTherapy, history: [baseline, rise] })
    expect(result).toMatchObject({ kind: 'qtc', baselineFridericia: 420, riseMs: 61 })
    expect(triage(reading('qtc', 481), { ...onTherapy, history: [reading('qtc', 421, '2025-01-10')] }).level).toBe('routine')
  })
})

describe('HbA1c (ADA Standards of Care 2025: 6.5 % or more is the diabetes range) -> routine', () => {
  it('6.5 % fires; 6.4 % (prediabetes) just misses', () => {
    const fired = triage(reading('hba1c', 6.5))
    expect(fired.level).toBe('routine')
    expect(rulesOf(fired)).toEqual(['a1c-diabetes-range'])
    expect(fired.reasons[0]!.source).toMatch(/ADA/)
    expect(triage(reading('hba1c', 6.4)).level).toBe('none')
  })

  it('6.8 %: eAG 28.7 x 6.8 - 46.7 = 148 mg/dL (8.2 mmol/L), IFCC 10.93 x 6.8 - 23.5 = 51 mmol/mol', () => {
    // Worked by hand: ADAG (Nathan 2008) 28.7 x 6.8 = 195.16, - 46.7 = 148.46 mg/dL;
    // 1.5944 x 6.8 = 10.84192, - 2.5944 = 8.24752 mmol/L (from memory);
    // IFCC (Hoelzel 2004) 10.93 x 6.8 = 74.324, - 23.5 = 50.824 mmol/mol.
    const result = interpretLab(reading('hba1c', 6.8), onTherapy)
    if (result.kind !== 'hba1c') throw new Error('kind')
    expect(result.eagMgDl).toBeCloseTo(148.46, 2)
    expect(result.eagMmolL).toBeCloseTo(8.2475, 3)
    expect(result.ifccMmolPerMol).toBeCloseTo(50.824, 3)
    expect(result.category).toBe('diabetes')
  })
})

describe('PSA doubling time under 3 months (Pound 1999 log-linear; threshold common practice, from memory) -> routine', () => {
  // Doubling every d days: ln 2 / slope = d exactly. Three months = 3 x 365.25 / 12 = 91.31 days.
  const series = (everyDays: number) => {
    // A nadir of 0.5, then three values doubling every `everyDays` (the fit starts after the nadir, PCWG3).
    const start = Date.UTC(2025, 0, 1)
    const day = (n: number) => new Date(start + n * 86_400_000).toISOString().slice(0, 10)
    return [reading('psa', 0.5, day(0)), reading('psa', 1, day(everyDays)), reading('psa', 2, day(2 * everyDays)), reading('psa', 4, day(3 * everyDays))]
  }
  const lastOf = (values: LabReading[]) => triage(values[3]!, { ...onTherapy, history: values.slice(0, 3) })

  it('doubling every 91 days (2.99 months) fires; every 92 days (3.02 months) just misses', () => {
    // Worked by hand (Pound 1999): 1, 2, 4 ng/mL at equal steps of d days lie on a line of
    // ln PSA with slope ln 2 / d, so the doubling time is ln 2 / slope = d days;
    // in months of 365.25 / 12 = 30.4375 days: 91 / 30.4375 = 2.9897, 92 / 30.4375 = 3.0226.
    const doublingOf = (values: LabReading[]) => interpretLab(values[3]!, { ...onTherapy, history: values })
    expect(doublingOf(series(91))).toMatchObject({ kind: 'psa', valuesUsed: 3, doubling: { status: 'rising' } })
    const fast = doublingOf(series(91))
    const slow = doublingOf(series(92))
    if (fast.kind !== 'psa' || fast.doubling.status !== 'rising' || slow.kind !== 'psa' || slow.doubling.status !== 'rising') throw new Error('not rising')
    expect(fast.doubling.days).toBeCloseTo(91, 6)
    expect(fast.doubling.months).toBeCloseTo(2.9897, 4)
    expect(slow.doubling.months).toBeCloseTo(3.0226, 4)
    const fired = lastOf(series(91))
    expect(fired.level).toBe('routine')
    expect(rulesOf(fired)).toEqual(['psa-fast-doubling'])
    expect(fired.reasons[0]!.source).toMatch(/Pound/)
    expect(lastOf(series(92)).level).toBe('none')
  })

  it('REFERENCES check (PCWG3): nadir 0.3, then 0.6, 1.2, 2.4 every 90 days -> 90 days, over his values since the nadir up to this one', () => {
    const values = [reading('psa', 4.0, '2024-10-03'), reading('psa', 0.3, '2025-01-01'), reading('psa', 0.6, '2025-04-01'), reading('psa', 1.2, '2025-06-30'), reading('psa', 2.4, '2025-09-28')]
    const result = interpretLab(values[4]!, { ...onTherapy, history: values })
    expect(result).toMatchObject({ kind: 'psa', valuesUsed: 3, doubling: { status: 'rising' } })
    if (result.kind === 'psa' && result.doubling.status === 'rising') expect(result.doubling.days).toBeCloseTo(90, 6)
    // The 1.2 result sees only two values since the nadir: too few, never a number.
    expect(interpretLab(values[3]!, { ...onTherapy, history: values })).toMatchObject({ valuesUsed: 2, doubling: { status: 'too-few-values' } })
  })

  it('a falling PSA is "not rising" and raises nothing; fewer than 3 values neither', () => {
    const falling = [reading('psa', 8, '2025-01-01'), reading('psa', 2, '2025-02-01'), reading('psa', 0.5, '2025-03-01')]
    const result = interpretLab(falling[2]!, { ...onTherapy, history: falling })
    expect(result).toMatchObject({ doubling: { status: 'not-rising' } })
    expect(evaluateLabTriage(result).level).toBe('none')
    expect(triage(reading('psa', 4))).toEqual({ level: 'none', reasons: [] })
  })
})

describe('the lab result schema', () => {
  const schema = labResultSchema('2025-06-02')
  it('takes one shape per kind and refuses a future date, a missing unit and values out of range', () => {
    expect(schema.safeParse({ kind: 'testosterone', takenOn: '2025-06-02', unit: 'ng/dL', value: '80' }).success).toBe(true)
    expect(schema.safeParse({ kind: 'qtc', takenOn: '2025-06-01', value: 430, heartRate: 72 }).success).toBe(true)
    const bad = schema.safeParse({ kind: 'testosterone', takenOn: '2025-06-03', value: 80 })
    expect(bad.success).toBe(false)
    const messages = bad.error!.issues.map(i => `${i.path.join('.')}:${i.message}`)
    expect(messages).toEqual(expect.arrayContaining(['takenOn:validation.labs.futureDate', 'unit:validation.labs.unitRequired']))
    expect(schema.safeParse({ kind: 'hba1c', takenOn: '2025-06-01', value: 68 }).success).toBe(false)
    expect(schema.safeParse({ kind: 'testosterone', takenOn: '2025-06-01', unit: 'nmol/L', value: 80 }).success).toBe(false)
    expect(schema.safeParse({ kind: 'psa', takenOn: '2025-06-01', value: 0 }).success).toBe(false)
    expect(schema.safeParse({ kind: 'glucose', takenOn: '2025-06-01', value: 5 }).success).toBe(false)
  })
})
