import { describe, expect, it } from 'vitest'
import {
  DAYS_PER_MONTH,
  GLUCOSE_MG_DL_PER_MMOL_L,
  TESTOSTERONE_NMOL_L_PER_NG_DL,
  a1cCategory,
  a1cIfccMmolPerMol,
  assessQtc,
  castrateStatus,
  estimatedAverageGlucoseMgDl,
  estimatedAverageGlucoseMmolL,
  fastingGlucoseCategory,
  glucoseToMgDl,
  psaDoublingTime,
  psaDoublingTimeFromResults,
  psaValuesSinceNadir,
  qtcBazett,
  qtcFridericia,
  qtcGrade,
  testosteroneNgDlToNmolL,
  testosteroneNmolLToNgDl,
} from '../../shared/clinical/labs'

const round = (value: number, places = 0) => Math.round(value * 10 ** places) / 10 ** places

describe('testosterone (Oefelein MG et al., Urology 2000; EAU guidelines, wording from memory)', () => {
  it('converts with molar mass 288.42 g/mol: 1 ng/dL = 10 / 288.42 nmol/L', () => {
    expect(TESTOSTERONE_NMOL_L_PER_NG_DL).toBeCloseTo(10 / 288.42, 5)
  })

  it('50 ng/dL -> 1.73 nmol/L; 20 -> 0.69; 1.7 nmol/L -> 49.0 ng/dL', () => {
    expect(round(testosteroneNgDlToNmolL(50), 2)).toBe(1.73)
    expect(round(testosteroneNgDlToNmolL(20), 2)).toBe(0.69)
    expect(round(testosteroneNmolLToNgDl(1.7), 1)).toBe(49.0)
    expect(testosteroneNmolLToNgDl(testosteroneNgDlToNmolL(37))).toBeCloseTo(37, 10)
  })

  it('is castrate below 50 ng/dL and below the stricter level under 20 ng/dL', () => {
    expect(castrateStatus(50, 'ng/dL')).toMatchObject({ castrate: false, belowStrictLevel: false })
    expect(castrateStatus(49.9, 'ng/dL')).toMatchObject({ castrate: true, belowStrictLevel: false })
    expect(castrateStatus(20, 'ng/dL')).toMatchObject({ castrate: true, belowStrictLevel: false })
    expect(castrateStatus(19.9, 'ng/dL')).toMatchObject({ castrate: true, belowStrictLevel: true })
  })

  it('takes nmol/L too: 1.7 nmol/L (about 49 ng/dL) is castrate, 0.7 (about 20.2) is not below 20', () => {
    const status = castrateStatus(1.7, 'nmol/L')
    expect(status.castrate).toBe(true)
    expect(status.ngPerDl).toBeCloseTo(1.7 / 0.03467, 6)
    expect(castrateStatus(0.7, 'nmol/L').belowStrictLevel).toBe(false)
    expect(castrateStatus(0.69, 'nmol/L').belowStrictLevel).toBe(true)
  })

  it('refuses a negative level', () => {
    expect(() => castrateStatus(-1, 'ng/dL')).toThrow(RangeError)
  })
})

describe('PSA doubling time (Pound CR et al., JAMA 1999 log-linear; Arlen PM et al., J Urol 2008, 3 values from memory)', () => {
  it('(0 mo 2.0, 3 mo 4.0, 6 mo 8.0) doubles every 3.00 months', () => {
    const result = psaDoublingTime([{ time: 0, psa: 2 }, { time: 3, psa: 4 }, { time: 6, psa: 8 }])
    // ln PSA rises by ln 2 every 3 months: slope ln2/3, doubling time ln2 / slope = 3.
    expect(result.status).toBe('rising')
    if (result.status !== 'rising') return
    expect(result.slope).toBeCloseTo(Math.LN2 / 3, 12)
    expect(round(result.doublingTime, 2)).toBe(3)
  })

  it('(day 0 1.0, 90 1.5, 180 2.1, 270 3.2) doubles in about 163 days', () => {
    const points = [{ time: 0, psa: 1.0 }, { time: 90, psa: 1.5 }, { time: 180, psa: 2.1 }, { time: 270, psa: 3.2 }]
    // Least squares by hand: slope = sum((t - mean t)(ln p - mean ln p)) / sum((t - mean t)^2).
    const meanT = (0 + 90 + 180 + 270) / 4
    const logs = points.map(p => Math.log(p.psa))
    const meanLog = logs.reduce((a, b) => a + b) / 4
    const slope = points.reduce((s, p, i) => s + (p.time - meanT) * ((logs[i] ?? 0) - meanLog), 0)
      / points.reduce((s, p) => s + (p.time - meanT) ** 2, 0)
    const result = psaDoublingTime(points)
    expect(result.status).toBe('rising')
    if (result.status !== 'rising') return
    expect(result.doublingTime).toBeCloseTo(Math.LN2 / slope, 9)
    expect(Math.round(result.doublingTime)).toBe(163)
  })

  it('is "not rising", never a number, when PSA is flat or falling', () => {
    expect(psaDoublingTime([{ time: 0, psa: 4 }, { time: 3, psa: 4 }, { time: 6, psa: 4 }]))
      .toEqual({ status: 'not-rising', slope: 0 })
    const falling = psaDoublingTime([{ time: 0, psa: 8 }, { time: 3, psa: 4 }, { time: 6, psa: 2 }])
    expect(falling.status).toBe('not-rising')
    expect(falling).not.toHaveProperty('doublingTime')
  })

  it('needs at least 3 values at 2 or more times', () => {
    expect(psaDoublingTime([{ time: 0, psa: 2 }, { time: 3, psa: 4 }])).toEqual({ status: 'too-few-values' })
    expect(psaDoublingTime([{ time: 0, psa: 2 }, { time: 0, psa: 4 }, { time: 0, psa: 8 }]))
      .toEqual({ status: 'too-few-values' })
    expect(() => psaDoublingTime([{ time: 0, psa: 0 }, { time: 1, psa: 1 }, { time: 2, psa: 2 }])).toThrow(RangeError)
  })

  it('works from dated results, in days and months, from the nadir on', () => {
    // Lowest value first, then PSA doubles every 90 days: the fit uses the values after the
    // lowest (PCWG3, Scher 2016), 2025-04-01 4, 2025-06-30 8, 2025-09-28 16 (90-day steps).
    const result = psaDoublingTimeFromResults([
      { date: '2025-01-01', psa: 2 },
      { date: '2025-04-01', psa: 4 },
      { date: '2025-06-30', psa: 8 },
      { date: '2025-09-28', psa: 16 },
    ])
    expect(result).toMatchObject({ status: 'rising', valuesUsed: 3 })
    if (result.status !== 'rising') return
    expect(result.days).toBeCloseTo(90, 9)
    expect(result.months).toBeCloseTo(90 / DAYS_PER_MONTH, 9)
    expect(psaDoublingTimeFromResults([])).toEqual({ status: 'too-few-values', valuesUsed: 0 })
  })

  it('is "not rising" when the latest value is the lowest', () => {
    expect(psaDoublingTimeFromResults([
      { date: '2025-01-01', psa: 3 },
      { date: '2025-04-01', psa: 2 },
      { date: '2025-06-30', psa: 1 },
    ])).toEqual({ status: 'not-rising', valuesUsed: 0 })
  })
})

describe('PSA doubling time on therapy from the nadir (Scher HI et al., PCWG3, J Clin Oncol 2016; Arlen PM et al., J Urol 2008: 3 values, 4 weeks apart, from memory)', () => {
  it('REFERENCES check: nadir 0.3, then 0.6, 1.2, 2.4 ng/mL every 90 days -> 90 days over (0.6, 1.2, 2.4)', () => {
    const result = psaDoublingTimeFromResults([
      { date: '2024-01-01', psa: 6.0 },
      { date: '2024-04-01', psa: 0.3 },
      { date: '2024-06-30', psa: 0.6 },
      { date: '2024-09-28', psa: 1.2 },
      { date: '2024-12-27', psa: 2.4 },
    ])
    // Three values, each double the one before, 90 days apart: ln2 / (ln2 / 90) = 90 days.
    expect(result).toMatchObject({ status: 'rising', valuesUsed: 3 })
    if (result.status === 'rising') expect(result.days).toBeCloseTo(90, 9)
  })

  it('a PSA rising from its nadir on therapy reads rising, although the fit over every value would fall', () => {
    const results = [
      { date: '2024-01-01', psa: 40 },
      { date: '2024-03-01', psa: 12 },
      { date: '2024-05-01', psa: 2 },
      { date: '2024-07-01', psa: 0.5 },
      { date: '2024-09-01', psa: 0.9 },
      { date: '2024-11-01', psa: 1.6 },
      { date: '2025-01-01', psa: 2.9 },
    ]
    // The whole series falls overall (a fit over all seven has a negative slope)...
    const all = psaDoublingTime(results.map(r => ({ time: Date.parse(r.date) / 86_400_000, psa: r.psa })))
    expect(all.status).toBe('not-rising')
    // ...but since the nadir of 0.5 it nearly doubles every two months.
    const since = psaDoublingTimeFromResults(results)
    expect(since.status).toBe('rising')
    if (since.status === 'rising') {
      expect(since.valuesUsed).toBe(3)
      expect(since.days).toBeGreaterThan(60)
      expect(since.days).toBeLessThan(80)
    }
  })

  it('three values on consecutive days give "too few values", not a doubling time of a week', () => {
    expect(psaDoublingTimeFromResults([
      { date: '2025-03-01', psa: 0.2 },
      { date: '2025-03-02', psa: 1.0 },
      { date: '2025-03-03', psa: 1.1 },
      { date: '2025-03-04', psa: 1.2 },
    ])).toEqual({ status: 'too-few-values', valuesUsed: 1 })
  })

  it('values under four weeks after the one kept before are left out (27 days out, 28 days in)', () => {
    const since = psaValuesSinceNadir([
      { date: '2025-01-01', psa: 0.1 },
      { date: '2025-02-01', psa: 0.2 },
      { date: '2025-02-28', psa: 0.3 },
      { date: '2025-03-01', psa: 0.4 },
    ])
    expect(since.map(r => r.date)).toEqual(['2025-02-01', '2025-03-01'])
  })

  it('two values after the nadir are not enough', () => {
    expect(psaDoublingTimeFromResults([
      { date: '2025-01-01', psa: 0.3 },
      { date: '2025-04-01', psa: 0.6 },
      { date: '2025-07-01', psa: 1.2 },
    ])).toEqual({ status: 'too-few-values', valuesUsed: 2 })
  })

  it('takes the later of two equal lowest values as the nadir', () => {
    expect(psaValuesSinceNadir([
      { date: '2025-01-01', psa: 0.3 },
      { date: '2025-03-01', psa: 0.5 },
      { date: '2025-05-01', psa: 0.3 },
      { date: '2025-07-01', psa: 0.6 },
    ]).map(r => r.date)).toEqual(['2025-07-01'])
  })
})

describe('HbA1c (Nathan DM et al., ADAG, Diabetes Care 2008; Hoelzel W et al., Clin Chem 2004; ADA 2025)', () => {
  it.each([
    [6, 126],
    [7, 154],
    [8, 183],
  ])('A1C %i percent -> eAG %i mg/dL (28.7 x A1C - 46.7)', (a1c, mgPerDl) => {
    expect(estimatedAverageGlucoseMgDl(a1c)).toBeCloseTo(28.7 * a1c - 46.7, 10)
    expect(Math.round(estimatedAverageGlucoseMgDl(a1c))).toBe(mgPerDl)
  })

  it('eAG in mmol/L (1.5944 x A1C - 2.5944, from memory) agrees with mg/dL / 18', () => {
    expect(estimatedAverageGlucoseMmolL(7)).toBeCloseTo(1.5944 * 7 - 2.5944, 10)
    expect(estimatedAverageGlucoseMmolL(7)).toBeCloseTo(estimatedAverageGlucoseMgDl(7) / 18, 1)
  })

  it('6.5 % -> 48 mmol/mol IFCC (10.93 x NGSP - 23.5)', () => {
    expect(a1cIfccMmolPerMol(6.5)).toBeCloseTo(10.93 * 6.5 - 23.5, 10)
    expect(Math.round(a1cIfccMmolPerMol(6.5))).toBe(48)
  })

  it('ADA categories: diabetes from 6.5 %, prediabetes 5.7-6.4 %', () => {
    expect(a1cCategory(5.6)).toBe('normal')
    expect(a1cCategory(5.7)).toBe('prediabetes')
    expect(a1cCategory(6.4)).toBe('prediabetes')
    expect(a1cCategory(6.5)).toBe('diabetes')
  })

  it('ADA fasting glucose: 100-125 prediabetes, 126 or more diabetes', () => {
    expect(fastingGlucoseCategory(99)).toBe('normal')
    expect(fastingGlucoseCategory(100)).toBe('prediabetes')
    expect(fastingGlucoseCategory(125)).toBe('prediabetes')
    expect(fastingGlucoseCategory(126)).toBe('diabetes')
  })

  it('converts glucose with molar mass 180.16 g/mol: 16.7 mmol/L is about 300 mg/dL', () => {
    expect(GLUCOSE_MG_DL_PER_MMOL_L).toBeCloseTo(180.16 / 10, 10)
    expect(Math.round(glucoseToMgDl({ value: 16.7, unit: 'mmol/L' }))).toBe(301)
    expect(glucoseToMgDl({ value: 250, unit: 'mg/dL' })).toBe(250)
  })
})

describe('QTc (Bazett, Heart 1920; Fridericia, Acta Med Scand 1920; CTCAE v5.0 grade)', () => {
  it('QT 400 ms at 75 bpm: Bazett 447, Fridericia 431 (RR = 60 / 75 = 0.8 s)', () => {
    const rr = 60 / 75
    expect(qtcBazett(400, 75)).toBeCloseTo(400 / Math.sqrt(rr), 10)
    expect(qtcFridericia(400, 75)).toBeCloseTo(400 / Math.cbrt(rr), 10)
    expect(Math.round(qtcBazett(400, 75))).toBe(447)
    expect(Math.round(qtcFridericia(400, 75))).toBe(431)
  })

  it('at 60 bpm (RR 1 s) both equal the QT', () => {
    expect(qtcBazett(400, 60)).toBe(400)
    expect(qtcFridericia(400, 60)).toBe(400)
  })

  it.each([
    [449, 0],
    [450, 1],
    [480, 1],
    [481, 2],
    [500, 2],
    [501, 3],
  ])('QTc %i ms is grade %i', (qtc, grade) => {
    expect(qtcGrade(qtc)).toBe(grade)
  })

  it('470 ms with a rise of 65 ms from baseline is grade 3; a rise of exactly 60 is not', () => {
    expect(qtcGrade(470, 470 - 65)).toBe(3)
    expect(qtcGrade(470, 470 - 60)).toBe(1)
  })

  it('grades on Fridericia and flags above 500 ms as high risk', () => {
    // QT 400 at 75 bpm: Bazett 447 (grade 0) and Fridericia 431 (grade 0).
    expect(assessQtc(400, 75)).toMatchObject({ grade: 0, highRisk: false })
    // QT 470 at 90 bpm: Bazett 575 would be grade 3, Fridericia 538 is grade 3 too.
    const fast = assessQtc(470, 90)
    expect(Math.round(fast.fridericia)).toBe(Math.round(470 / Math.cbrt(60 / 90)))
    expect(fast.grade).toBe(qtcGrade(fast.fridericia))
    expect(fast.highRisk).toBe(true)
    // QT 420 at 90 bpm: Bazett 514 (would be grade 3), Fridericia 481 (grade 2): Fridericia drives it.
    const moderate = assessQtc(420, 90)
    expect(Math.round(moderate.bazett)).toBe(514)
    expect(Math.round(moderate.fridericia)).toBe(481)
    expect(moderate.grade).toBe(2)
    expect(moderate.highRisk).toBe(false)
  })

  it('refuses a heart rate of zero', () => {
    expect(() => qtcBazett(400, 0)).toThrow(RangeError)
  })
})
