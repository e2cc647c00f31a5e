import { daysBetween } from '../schedule/rules'

/*
 * Laboratory and ECG calculations shown to staff beside a patient's results. Each
 * function names its published source.
 */

/*
 * Testosterone. Oefelein MG et al., Urology 2000;56:1021-1024; EAU prostate cancer
 * guidelines (wording from memory). Castrate level: below 50 ng/dL (1.7 nmol/L); the
 * stricter level below 20 ng/dL (0.7 nmol/L) is shown too.
 * Conversion: molar mass 288.42 g/mol, so 1 ng/dL = 10 ng/L = 10 / 288.42 nmol/L.
 */
export const TESTOSTERONE_NMOL_L_PER_NG_DL = 0.03467
export const CASTRATE_NG_DL = 50
export const STRICT_CASTRATE_NG_DL = 20

export type TestosteroneUnit = 'ng/dL' | 'nmol/L'

export function testosteroneNgDlToNmolL(ngPerDl: number): number {
  return ngPerDl * TESTOSTERONE_NMOL_L_PER_NG_DL
}

export function testosteroneNmolLToNgDl(nmolPerL: number): number {
  return nmolPerL / TESTOSTERONE_NMOL_L_PER_NG_DL
}

export interface CastrateStatus {
  ngPerDl: number
  nmolPerL: number
  /** Below 50 ng/dL. */
  castrate: boolean
  /** Below 20 ng/dL. */
  belowStrictLevel: boolean
}

export function castrateStatus(value: number, unit: TestosteroneUnit): CastrateStatus {
  if (!Number.isFinite(value) || value < 0) {
    throw new RangeError(`A testosterone level must be zero or more, got ${value}`)
  }
  const ngPerDl = unit === 'ng/dL' ? value : testosteroneNmolLToNgDl(value)
  return {
    ngPerDl,
    nmolPerL: unit === 'nmol/L' ? value : testosteroneNgDlToNmolL(value),
    castrate: ngPerDl < CASTRATE_NG_DL,
    belowStrictLevel: ngPerDl < STRICT_CASTRATE_NG_DL,
  }
}

/*
 * PSA doubling time. Pound CR et al., JAMA 1999;281:1591-1597 (log-linear method):
 * least-squares fit of ln(PSA) on time; doubling time = ln 2 / slope. Arlen PM et al.,
 * J Urol 2008;179:2181-2185: at least 3 values (and at least 4 weeks apart, from memory;
 * the spacing is left to the person reading the result). A slope of zero or less means
 * "not rising" and never gives a number.
 */
export interface PsaPoint {
  /** Time in any unit; the doubling time comes out in the same unit. */
  time: number
  psa: number
}

export type PsaDoublingTime =
  | { status: 'too-few-values' }
  | { status: 'not-rising', slope: number }
  | { status: 'rising', slope: number, doublingTime: number }

export const PSA_MIN_VALUES = 3

export function psaDoublingTime(points: readonly PsaPoint[]): PsaDoublingTime {
  for (const point of points) {
    if (!Number.isFinite(point.psa) || point.psa <= 0) {
      throw new RangeError(`A PSA value must be above zero for the log-linear fit, got ${point.psa}`)
    }
  }
  const distinctTimes = new Set(points.map(point => point.time))
  if (points.length < PSA_MIN_VALUES || distinctTimes.size < 2) return { status: 'too-few-values' }

  const n = points.length
  const meanTime = points.reduce((sum, p) => sum + p.time, 0) / n
  const meanLog = points.reduce((sum, p) => sum + Math.log(p.psa), 0) / n
  let covariance = 0
  let variance = 0
  for (const point of points) {
    covariance += (point.time - meanTime) * (Math.log(point.psa) - meanLog)
    variance += (point.time - meanTime) ** 2
  }
  const slope = covariance / variance
  if (slope <= 0) return { status: 'not-rising', slope }
  return { status: 'rising', slope, doublingTime: Math.LN2 / slope }
}

export interface PsaResult {
  date: string
  psa: number
}

/** Average days in a month (365.25 / 12), to show a doubling time in months. */
export const DAYS_PER_MONTH = 365.25 / 12

/** Values for a doubling time on therapy are at least this many days apart (Arlen 2008, 4 weeks; from memory). */
export const PSA_MIN_SPACING_DAYS = 28

export type DatedPsaDoublingTime =
  | { status: 'too-few-values', valuesUsed: number }
  | { status: 'not-rising', valuesUsed: number }
  | { status: 'rising', days: number, months: number, valuesUsed: number }

/**
 * The values a doubling time on therapy is fitted over. Scher HI et al. (PCWG3), J Clin
 * Oncol 2016;34:1402-1418: on therapy the rise is measured from the nadir, so the fit uses
 * the values after the lowest one (the latest, when the lowest comes twice), never the fall
 * before it. Of values closer than four weeks to the one kept before, only the first is
 * kept (Arlen PM et al., J Urol 2008: values at least 4 weeks apart; from memory).
 */
export function psaValuesSinceNadir(results: readonly PsaResult[]): PsaResult[] {
  const sorted = [...results].sort((a, b) => a.date.localeCompare(b.date))
  let nadir = -1
  sorted.forEach((result, index) => {
    if (nadir < 0 || result.psa <= sorted[nadir]!.psa) nadir = index
  })
  const kept: PsaResult[] = []
  for (const result of sorted.slice(nadir + 1)) {
    const last = kept.at(-1)
    if (last === undefined || daysBetween(last.date, result.date) >= PSA_MIN_SPACING_DAYS) kept.push(result)
  }
  return kept
}

/**
 * PSA doubling time on therapy from dated results ('YYYY-MM-DD'), in days and in months:
 * the log-linear fit (Pound 1999) over the values since the nadir (psaValuesSinceNadir),
 * with at least three of them; fewer gives "too few values", never a number. A series whose
 * latest value is its lowest is "not rising".
 */
export function psaDoublingTimeFromResults(results: readonly PsaResult[]): DatedPsaDoublingTime {
  const used = psaValuesSinceNadir(results)
  if (results.length >= PSA_MIN_VALUES && used.length === 0) return { status: 'not-rising', valuesUsed: 0 }
  const first = used[0]
  if (first === undefined || used.length < PSA_MIN_VALUES) return { status: 'too-few-values', valuesUsed: used.length }
  const fit = psaDoublingTime(used.map(result => ({
    time: daysBetween(first.date, result.date),
    psa: result.psa,
  })))
  if (fit.status === 'too-few-values') return { status: 'too-few-values', valuesUsed: used.length }
  if (fit.status === 'not-rising') return { status: 'not-rising', valuesUsed: used.length }
  return { status: 'rising', days: fit.doublingTime, months: fit.doublingTime / DAYS_PER_MONTH, valuesUsed: used.length }
}

/*
 * HbA1c. Nathan DM et al. (ADAG study), Diabetes Care 2008;31:1473-1478: estimated
 * average glucose mg/dL = 28.7 x A1C - 46.7 (mmol/L = 1.5944 x A1C - 2.5944, from
 * memory). IFCC units: mmol/mol = 10.93 x NGSP % - 23.5 (Hoelzel W et al., Clin Chem
 * 2004;50:166-174). Categories: ADA Standards of Care 2025, Diabetes Care 48(Suppl 1):
 * diabetes A1C >= 6.5 %, prediabetes 5.7-6.4 %.
 */
export function estimatedAverageGlucoseMgDl(a1cPercent: number): number {
  // Worked in tenths so that 6 % gives exactly 125.5 (the published 126), not 125.4999...
  return (287 * a1cPercent - 467) / 10
}

export function estimatedAverageGlucoseMmolL(a1cPercent: number): number {
  return 1.5944 * a1cPercent - 2.5944
}

export function a1cIfccMmolPerMol(a1cPercent: number): number {
  return 10.93 * a1cPercent - 23.5
}

export type GlycaemicCategory = 'normal' | 'prediabetes' | 'diabetes'

export function a1cCategory(a1cPercent: number): GlycaemicCategory {
  if (a1cPercent >= 6.5) return 'diabetes'
  if (a1cPercent >= 5.7) return 'prediabetes'
  return 'normal'
}

/*
 * Glucose units. Molar mass of glucose 180.16 g/mol, so 1 mmol/L = 180.16 mg/L =
 * 18.016 mg/dL.
 */
export type GlucoseUnit = 'mg/dL' | 'mmol/L'
export const GLUCOSE_MG_DL_PER_MMOL_L = 18.016

export function glucoseToMgDl(reading: { value: number, unit: GlucoseUnit }): number {
  return reading.unit === 'mg/dL' ? reading.value : reading.value * GLUCOSE_MG_DL_PER_MMOL_L
}

/*
 * QTc. Bazett HC, Heart 1920;7:353-370: QTc = QT / sqrt(RR). Fridericia LS, Acta Med
 * Scand 1920;53:469-486: QTc = QT / cbrt(RR). RR in seconds = 60 / heart rate.
 * Grade: CTCAE v5.0 "Electrocardiogram QT corrected interval prolonged": 1 = 450-480 ms;
 * 2 = 481-500 ms; 3 = 501 ms or more, or a rise of more than 60 ms from baseline.
 * Above 500 ms is widely treated as high risk. The grade uses Fridericia's QTc, which is
 * recommended over Bazett's (Bazett over-corrects at fast heart rates).
 */
function rrSeconds(heartRate: number): number {
  if (!Number.isFinite(heartRate) || heartRate <= 0) {
    throw new RangeError(`Heart rate must be above zero, got ${heartRate}`)
  }
  return 60 / heartRate
}

export function qtcBazett(qtMs: number, heartRate: number): number {
  return qtMs / Math.sqrt(rrSeconds(heartRate))
}

export function qtcFridericia(qtMs: number, heartRate: number): number {
  return qtMs / Math.cbrt(rrSeconds(heartRate))
}

/** CTCAE grade of a QTc; values are rounded to whole milliseconds first, as ECGs report them. */
export function qtcGrade(qtcMs: number, baselineQtcMs?: number): 0 | 1 | 2 | 3 {
  const qtc = Math.round(qtcMs)
  const rise = baselineQtcMs === undefined ? 0 : qtc - Math.round(baselineQtcMs)
  if (qtc >= 501 || rise > 60) return 3
  if (qtc >= 481) return 2
  if (qtc >= 450) return 1
  return 0
}

export interface QtcAssessment {
  bazett: number
  fridericia: number
  /** CTCAE grade from Fridericia's QTc. */
  grade: 0 | 1 | 2 | 3
  /** Fridericia's QTc above 500 ms. */
  highRisk: boolean
}

export function assessQtc(qtMs: number, heartRate: number, baselineQtcMs?: number): QtcAssessment {
  const fridericia = qtcFridericia(qtMs, heartRate)
  return {
    bazett: qtcBazett(qtMs, heartRate),
    fridericia,
    grade: qtcGrade(fridericia, baselineQtcMs),
    highRisk: Math.round(fridericia) > 500,
  }
}
