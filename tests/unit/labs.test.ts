import { describe, expect, it } from 'vitest'
import {
  GLUCOSE_MG_DL_PER_MMOL_L,
  TESTOSTERONE_NMOL_L_PER_NG_DL,
  a1cCategory,
  a1cIfccMmolPerMol,
  assessQtc,
  castrateStatus,
  estimatedAverageGlucoseMgDl,
  estimatedAverageGlucoseMmolL,
  glucoseToMgDl,
  psaDoublingTime,
  psaDoublingTimeFromResults,
  psaValuesSinceNadir,
  qtcBazett,
  qtcFridericia,
  qtcGrade,
  testosteroneNgDlToNmolL,
  testosteroneNmolLToNgDl,
} from '#shared/labs/calculations'

const round = (value: number, places = 0) => Math.round(value * 10 ** places) / 10 ** places

describe('testosterone (Oefelein MG et al., Urology 2000; EAU guidelines, wording from memory)', () => {
  it('converts with molar mass 288.42 g/mol: 1 ng/dL = 10 / 288.42 nmol/L', () => {
    // 1 ng/dL = 10 ng/L; 10 / 288.42 = 0.034672 nmol/L (REFERENCES.md rounds it to 0.03467).
    expect(TESTOSTERONE_NMOL_L_PER_NG_DL).toBeCloseTo(0.034672, 5)
  })

  it('50 ng/dL -> 1.73 nmol/L; 20 -> 0.69; 1.7 nmol/L -> 49.0 ng/dL', () => {
    expect(round(testosteroneNgDlToNmolL(50), 2)).toBe(1.73)
    expect(round(testosteroneNgDlToNmolL(20), 2)).toBe(0.69)
    expect(round(testosteroneNmolLToNgDl(1.7), 1)).toBe(49.0)
    // 37 ng/dL x 0.03467 = 1.28279 nmol/L, and 1.28279 / 0.03467 = 37.0 ng/dL.
    expect(testosteroneNgDlToNmolL(37)).toBeCloseTo(1.28279, 5)
    expect(testosteroneNmolLToNgDl(1.28279)).toBeCloseTo(37, 5)
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
    // 1.7 / 0.03467 = 49.034 ng/dL; 0.7 / 0.03467 = 20.190 (not below 20); 0.69 / 0.03467 = 19.902.
    expect(status.ngPerDl).toBeCloseTo(49.034, 3)
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
    // ln PSA rises by ln 2 every 3 months: slope 0.693147 / 3 = 0.231049 per month,
    // doubling time ln 2 / slope = 3.
    expect(result.status).toBe('rising')
    if (result.status !== 'rising') return
    expect(result.slope).toBeCloseTo(0.231049, 6)
    expect(round(result.doublingTime, 2)).toBe(3)
  })

  it('(day 0 1.0, 90 1.5, 180 2.1, 270 3.2) doubles in about 163 days', () => {
    const points = [{ time: 0, psa: 1.0 }, { time: 90, psa: 1.5 }, { time: 180, psa: 2.1 }, { time: 270, psa: 3.2 }]
    // Least squares worked by hand (Pound 1999): slope = sum((t - mean t)(ln p - mean ln p)) / sum((t - mean t)^2).
    // mean t = 135; t - mean t = -135, -45, 45, 135; sum of squares = 2 x (18225 + 2025) = 40500.
    // ln p = 0, 0.405465, 0.741937, 1.163151; mean ln p = 0.577638.
    // sum of products = -135 x -0.577638 - 45 x -0.172173 + 45 x 0.164299 + 135 x 0.585513 = 172.167.
    // slope = 172.167 / 40500 = 0.0042510 per day; doubling time = 0.693147 / 0.0042510 = 163.05 days.
    const result = psaDoublingTime(points)
    expect(result.status).toBe('rising')
    if (result.status !== 'rising') return
    expect(result.slope).toBeCloseTo(0.0042510, 6)
    expect(result.doublingTime).toBeCloseTo(163.05, 1)
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
    // 90 days in months of 365.25 / 12 = 30.4375 days: 90 / 30.4375 = 2.9569.
    expect(result.days).toBeCloseTo(90, 9)
    expect(result.months).toBeCloseTo(2.9569, 4)
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
    // ...but since the nadir of 0.5 it nearly doubles every two months. Worked by hand over
    // 0.9, 1.6, 2.9 at days 0, 61, 122 (2024-09-01, 11-01, 2025-01-01): with three equally
    // spaced times the least-squares slope is (ln 2.9 - ln 0.9) / 122 = (1.064711 + 0.105361)
    // / 122 = 0.0095907 per day; doubling time 0.693147 / 0.0095907 = 72.27 days.
    const since = psaDoublingTimeFromResults(results)
    expect(since.status).toBe('rising')
    if (since.status === 'rising') {
      expect(since.valuesUsed).toBe(3)
      expect(since.days).toBeCloseTo(72.27, 1)
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
  // Worked by hand, 28.7 x A1C - 46.7: 172.2 - 46.7 = 125.5; 200.9 - 46.7 = 154.2; 229.6 - 46.7 = 182.9.
  it.each([
    [6, 125.5, 126],
    [7, 154.2, 154],
    [8, 182.9, 183],
  ])('A1C %i percent -> eAG %d = %i mg/dL (28.7 x A1C - 46.7)', (a1c, exact, mgPerDl) => {
    expect(estimatedAverageGlucoseMgDl(a1c)).toBeCloseTo(exact, 6)
    expect(Math.round(estimatedAverageGlucoseMgDl(a1c))).toBe(mgPerDl)
  })

  it('eAG in mmol/L (1.5944 x A1C - 2.5944, from memory) agrees with mg/dL / 18', () => {
    // 1.5944 x 7 = 11.1608, - 2.5944 = 8.5664 mmol/L; the mg/dL value 154.2 / 18 = 8.567.
    expect(estimatedAverageGlucoseMmolL(7)).toBeCloseTo(8.5664, 4)
  })

  it('6.5 % -> 48 mmol/mol IFCC (10.93 x NGSP - 23.5)', () => {
    // 10.93 x 6.5 = 71.045, - 23.5 = 47.545, which rounds to 48.
    expect(a1cIfccMmolPerMol(6.5)).toBeCloseTo(47.545, 6)
    expect(Math.round(a1cIfccMmolPerMol(6.5))).toBe(48)
  })

  it('ADA categories: diabetes from 6.5 %, prediabetes 5.7-6.4 %', () => {
    expect(a1cCategory(5.6)).toBe('normal')
    expect(a1cCategory(5.7)).toBe('prediabetes')
    expect(a1cCategory(6.4)).toBe('prediabetes')
    expect(a1cCategory(6.5)).toBe('diabetes')
  })

  it('converts glucose with molar mass 180.16 g/mol: 16.7 mmol/L is about 300 mg/dL', () => {
    // 180.16 g/mol: 1 mmol/L = 180.16 mg/L = 18.016 mg/dL; 16.7 x 18.016 = 300.87 mg/dL.
    expect(GLUCOSE_MG_DL_PER_MMOL_L).toBe(18.016)
    expect(glucoseToMgDl({ value: 16.7, unit: 'mmol/L' })).toBeCloseTo(300.867, 3)
    expect(Math.round(glucoseToMgDl({ value: 16.7, unit: 'mmol/L' }))).toBe(301)
    expect(glucoseToMgDl({ value: 250, unit: 'mg/dL' })).toBe(250)
  })
})

describe('QTc (Bazett, Heart 1920; Fridericia, Acta Med Scand 1920; CTCAE v5.0 grade)', () => {
  it('QT 400 ms at 75 bpm: Bazett 447, Fridericia 431 (RR = 60 / 75 = 0.8 s)', () => {
    // Worked by hand: sqrt(0.8) = 0.894427, 400 / 0.894427 = 447.214 ms (Bazett);
    // cbrt(0.8) = 0.928318, 400 / 0.928318 = 430.887 ms (Fridericia).
    expect(qtcBazett(400, 75)).toBeCloseTo(447.214, 3)
    expect(qtcFridericia(400, 75)).toBeCloseTo(430.887, 3)
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
    // Baseline 405 ms: 470 - 405 = 65 ms rise, grade 3; baseline 410 ms: 60 ms, grade 1 by value (450-480).
    expect(qtcGrade(470, 405)).toBe(3)
    expect(qtcGrade(470, 410)).toBe(1)
  })

  it('grades on Fridericia and flags above 500 ms as high risk', () => {
    // QT 400 at 75 bpm: Bazett 447 (grade 0) and Fridericia 431 (grade 0).
    expect(assessQtc(400, 75)).toMatchObject({ grade: 0, highRisk: false })
    // QT 470 at 90 bpm (RR 0.6667 s): Bazett 470 / 0.81650 = 575.63 would be grade 3,
    // Fridericia 470 / 0.87358 = 538.02 is grade 3 too (501 ms or more, CTCAE v5.0).
    const fast = assessQtc(470, 90)
    expect(fast.fridericia).toBeCloseTo(538.02, 2)
    expect(fast.bazett).toBeCloseTo(575.63, 2)
    expect(fast.grade).toBe(3)
    expect(fast.highRisk).toBe(true)
    // QT 420 at 90 bpm: Bazett 420 / 0.81650 = 514.39 (would be grade 3), Fridericia
    // 420 / 0.87358 = 480.78, 481 ms as an ECG reports it (grade 2): Fridericia drives it.
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
