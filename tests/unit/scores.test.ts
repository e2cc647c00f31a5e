import { describe, expect, it } from 'vitest'
import {
  HOT_FLUSH_WEIGHTS,
  gradeFatigue,
  gradeHotFlashes,
  gradeInjectionSite,
  hotFlushScore,
  hotFlushScoreFromDiary,
  ipss,
  phq2,
} from '#shared/diary/scores'

const noSiteSigns = { pain: false, redness: false, swelling: false, lump: false, feverOrSpreadingRednessOrPus: false }

describe('hot-flush score (Sloan JA et al., J Clin Oncol 2001; weights from memory)', () => {
  it('weights mild 1, moderate 2, severe 3, very severe 4', () => {
    expect(HOT_FLUSH_WEIGHTS).toEqual({ 'none': 0, 'mild': 1, 'moderate': 2, 'severe': 3, 'very-severe': 4 })
  })

  it('4 mild + 3 moderate + 1 severe a day scores 13 (REFERENCES.md check)', () => {
    // Sloan 2001: sum of count x weight = 4 x 1 + 3 x 2 + 1 x 3 = 4 + 6 + 3 = 13.
    expect(hotFlushScore({ 'mild': 4, 'moderate': 3, 'severe': 1 })).toBe(13)
  })

  it('2 very severe scores 8 (REFERENCES.md check)', () => {
    // 2 x 4 = 8.
    expect(hotFlushScore({ 'very-severe': 2 })).toBe(8)
  })

  it('none scores 0', () => {
    expect(hotFlushScore({})).toBe(0)
    expect(hotFlushScore({ none: 5 })).toBe(0)
  })

  it('accepts an average count per day', () => {
    // 2.5 x 1 + 0.5 x 2 = 2.5 + 1 = 3.5.
    expect(hotFlushScore({ mild: 2.5, moderate: 0.5 })).toBe(3.5)
  })

  it('from the diary counts every flush at the worst severity (an upper estimate)', () => {
    // 6 a day, worst moderate: 6 x 2 = 12.
    expect(hotFlushScoreFromDiary(6, 'moderate')).toBe(12)
    // 2 a day, worst very severe: 2 x 4 = 8.
    expect(hotFlushScoreFromDiary(2, 'very-severe')).toBe(8)
    expect(hotFlushScoreFromDiary(0, 'none')).toBe(0)
    expect(hotFlushScoreFromDiary(3, 'none')).toBe(0)
    // Upper estimate: 4 mild + 3 moderate + 1 severe (Sloan score 13) reported as 8 a day,
    // worst severe: 8 x 3 = 24, above the 13 of the detailed count.
    expect(hotFlushScoreFromDiary(8, 'severe')).toBe(24)
  })

  it('refuses a negative count', () => {
    expect(() => hotFlushScore({ mild: -1 })).toThrow(RangeError)
  })
})

describe('IPSS (Barry MJ et al., J Urol 1992: mild 0-7, moderate 8-19, severe 20-35)', () => {
  it('[1,2,0,1,3,0,2] totals 9, moderate (REFERENCES.md check)', () => {
    // 1 + 2 + 0 + 1 + 3 + 0 + 2 = 9, in 8-19: moderate.
    expect(ipss([1, 2, 0, 1, 3, 0, 2])).toEqual({ total: 9, band: 'moderate', qualityOfLife: null })
  })

  it.each([
    [[0, 0, 0, 0, 0, 0, 0], 0, 'mild'],
    [[1, 1, 1, 1, 1, 1, 1], 7, 'mild'],
    [[2, 1, 1, 1, 1, 1, 1], 8, 'moderate'],
    [[3, 3, 3, 3, 3, 2, 2], 19, 'moderate'],
    [[3, 3, 3, 3, 3, 3, 2], 20, 'severe'],
    [[5, 5, 5, 5, 5, 5, 5], 35, 'severe'],
  ])('%j totals %i, %s', (items, total, band) => {
    expect(ipss(items)).toMatchObject({ total, band })
  })

  it('reports quality of life beside the total and never adds it', () => {
    const items = [1, 1, 1, 1, 1, 1, 1]
    const result = ipss(items, 6)
    expect(result.total).toBe(7)
    expect(result.band).toBe('mild')
    expect(result.qualityOfLife).toBe(6)
  })

  it('refuses the wrong number of items or out-of-range answers', () => {
    expect(() => ipss([1, 1, 1, 1, 1, 1])).toThrow(RangeError)
    expect(() => ipss([1, 1, 1, 1, 1, 1, 6])).toThrow(RangeError)
    expect(() => ipss([1, 1, 1, 1, 1, 1, 1], 7)).toThrow(RangeError)
  })
})

describe('PHQ-2 (Kroenke K, Spitzer RL, Williams JB, Med Care 2003: 3 or more is positive)', () => {
  it.each([
    [0, 0, 0, false],
    [1, 1, 2, false],
    [2, 1, 3, true],
    [0, 3, 3, true],
    [3, 3, 6, true],
  ])('%i + %i = %i, positive %s', (interest, down, total, positive) => {
    expect(phq2(interest, down)).toEqual({ total, positive })
  })

  it('refuses items outside 0-3', () => {
    expect(() => phq2(4, 0)).toThrow(RangeError)
    expect(() => phq2(0, -1)).toThrow(RangeError)
  })
})

describe('CTCAE v5.0 grades', () => {
  it('hot flashes: 0 none, 1 mild, 2 limits usual activities, 3 limits self-care', () => {
    expect(gradeHotFlashes({ perDay: 0, worstSeverity: 'none', interference: 'none' })).toBe(0)
    expect(gradeHotFlashes({ perDay: 3, worstSeverity: 'mild', interference: 'none' })).toBe(1)
    expect(gradeHotFlashes({ perDay: 5, worstSeverity: 'moderate', interference: 'usual-activities' })).toBe(2)
    expect(gradeHotFlashes({ perDay: 8, worstSeverity: 'severe', interference: 'self-care' })).toBe(3)
  })

  it('hot flashes: the grade follows the interference, not the worst severity (our design)', () => {
    expect(gradeHotFlashes({ perDay: 2, worstSeverity: 'very-severe', interference: 'none' })).toBe(1)
  })

  it('fatigue: 1 eased by rest, 2 limits usual activities, 3 limits self-care', () => {
    expect(gradeFatigue('none')).toBe(0)
    expect(gradeFatigue('eased-by-rest')).toBe(1)
    expect(gradeFatigue('limits-usual-activities')).toBe(2)
    expect(gradeFatigue('limits-self-care')).toBe(3)
  })

  it('injection site: 1 redness, 2 pain or swelling; infection signs placed at 3 (our mapping)', () => {
    expect(gradeInjectionSite(noSiteSigns)).toBe(0)
    expect(gradeInjectionSite({ ...noSiteSigns, redness: true })).toBe(1)
    expect(gradeInjectionSite({ ...noSiteSigns, lump: true })).toBe(1)
    expect(gradeInjectionSite({ ...noSiteSigns, pain: true })).toBe(2)
    expect(gradeInjectionSite({ ...noSiteSigns, swelling: true, redness: true })).toBe(2)
    expect(gradeInjectionSite({ ...noSiteSigns, feverOrSpreadingRednessOrPus: true })).toBe(3)
  })
})
