import { describe, expect, it } from 'vitest'
import {
  FULFILLED_BY_LAB,
  MONITORING_DEFAULTS,
  MONITORING_KINDS,
  MONITORING_SOURCES,
  defaultIntervalDays,
  doneAfter,
  dueState,
  firstDueOf,
  nextDueOn,
  planFromDefaults,
} from '#shared/monitoring/rules'
import type { MonitoringKind, PlanItem } from '#shared/monitoring/rules'

/*
 * The monitoring plan. Every expected date below is counted by hand on the calendar from
 * the intervals stated in shared/monitoring/rules.ts (the counting is in the comment), not
 * computed by the code. Intervals: 28, 84, 112 and 168 days are the 1-, 3-, 4- and 6-month
 * depots (US prescribing information, section 2). The defaults' own sources are named in
 * MONITORING_SOURCES; where they say "from memory" or "common practice", so do these tests.
 */

const defaultOf = (kind: MonitoringKind) => MONITORING_DEFAULTS.find(entry => entry.kind === kind)!
const itemOf = (items: PlanItem[], kind: MonitoringKind) => items.find(item => item.kind === kind)!

describe('the clinic defaults', () => {
  it('cover every kind once, and every default names a source', () => {
    expect(MONITORING_DEFAULTS.map(entry => entry.kind).sort()).toEqual([...MONITORING_KINDS].sort())
    for (const entry of MONITORING_DEFAULTS) {
      expect(entry.sources.length, entry.kind).toBeGreaterThan(0)
      for (const source of entry.sources) expect(MONITORING_SOURCES[source], `${entry.kind} ${source}`).toBeTruthy()
    }
  })

  it('say "from memory" or "common practice" where no source was checked word for word', () => {
    expect(MONITORING_SOURCES.eauFollowUp).toMatch(/from memory/)
    expect(MONITORING_SOURCES.lipidsAdvisory).toMatch(/from memory/)
    expect(MONITORING_SOURCES.bone).toMatch(/from memory/)
    expect(MONITORING_SOURCES.commonPractice).toBe('Common practice')
  })

  it('ECG and electrolytes are for men with QT risk factors (prescribing information, Warnings: QT/QTc)', () => {
    expect(defaultOf('ecg').onlyWith).toEqual(['heartDisease', 'longQt'])
    expect(defaultOf('electrolytes').onlyWith).toEqual(['heartDisease', 'longQt'])
    expect(defaultOf('psa').onlyWith).toBeUndefined()
  })

  it('a result entered in Tidewell fulfils testosterone, PSA, HbA1c (glucose) and QTc (ECG)', () => {
    expect(FULFILLED_BY_LAB).toEqual({ testosterone: 'testosterone', psa: 'psa', hba1c: 'glucose', qtc: 'ecg' })
  })
})

describe('intervals per regimen: the target rounded down to whole injection cycles, at least one', () => {
  // PSA every 84 days (3 months; EAU, from memory): 84/28 = 3 cycles -> 84; 84/84 = 1 -> 84;
  // 84/112 < 1 -> one cycle, 112; 84/168 < 1 -> 168.
  it.each([[28, 84], [84, 84], [112, 112], [168, 168]])('PSA on a %i-day regimen: every %i days', (cycle, days) => {
    expect(defaultIntervalDays(defaultOf('psa'), cycle)).toBe(days)
  })
  // Testosterone every 168 days: 168/28 = 6 -> 168; 168/84 = 2 -> 168; 168/112 = 1.5 -> 1 cycle, 112; 168/168 -> 168.
  it.each([[28, 168], [84, 168], [112, 112], [168, 168]])('testosterone on a %i-day regimen: every %i days', (cycle, days) => {
    expect(defaultIntervalDays(defaultOf('testosterone'), cycle)).toBe(days)
  })
  // Lipids yearly (365): 365/28 = 13.04 -> 13 x 28 = 364; 365/84 = 4.35 -> 336; 365/112 = 3.26 -> 336; 365/168 = 2.17 -> 336.
  it.each([[28, 364], [84, 336], [112, 336], [168, 336]])('lipids on a %i-day regimen: every %i days', (cycle, days) => {
    expect(defaultIntervalDays(defaultOf('lipids'), cycle)).toBe(days)
  })
  it('blood pressure and weight at every injection visit; bone density every 730 days whatever the regimen', () => {
    expect(defaultIntervalDays(defaultOf('blood-pressure'), 84)).toBe(84)
    expect(defaultIntervalDays(defaultOf('weight'), 28)).toBe(28)
    expect(defaultIntervalDays(defaultOf('bone-density'), 28)).toBe(730)
    expect(defaultIntervalDays(defaultOf('bone-density'), 168)).toBe(730)
  })
})

describe('first due', () => {
  const oneMonth = { cycleDays: 28, startsOn: '2026-01-05', lastInjectionOn: '2026-01-05' }
  it('84 days after the regimen start: 2026-01-05 + 84 = 2026-03-30 (26 days to Jan 31, 28 in Feb, 30 into March)', () => {
    expect(firstDueOf({ from: 'regimen-start', days: 84 }, oneMonth, '2026-01-05')).toBe('2026-03-30')
  })
  it('one cycle after the last injection: 2026-01-05 + 28 = 2026-02-02', () => {
    expect(firstDueOf({ from: 'last-injection', cycles: 1 }, oneMonth, '2026-01-05')).toBe('2026-02-02')
  })
  it('from the start when there is no injection yet', () => {
    expect(firstDueOf({ from: 'last-injection', cycles: 1 }, { ...oneMonth, lastInjectionOn: null }, '2026-01-05')).toBe('2026-02-02')
  })
  it('never before today: a baseline check on a plan made two years late is due today', () => {
    expect(firstDueOf({ from: 'regimen-start', days: 0 }, { cycleDays: 84, startsOn: '2024-02-01', lastInjectionOn: '2025-12-01' }, '2026-01-05')).toBe('2026-01-05')
  })
})

describe('next due', () => {
  it('never done: the first-due date', () => {
    expect(nextDueOn({ kind: 'lipids', intervalDays: 336, firstDueOn: '2026-03-30', lastDoneOn: null })).toBe('2026-03-30')
  })
  it('after a result: PSA done 2026-03-30, every 84 days -> 2026-06-22 (1 to Mar 31, 30 in April, 31 in May, 22 into June)', () => {
    expect(nextDueOn({ kind: 'psa', intervalDays: 84, firstDueOn: '2026-03-30', lastDoneOn: '2026-03-30' })).toBe('2026-06-22')
  })
  it('across 29 February: done 2028-02-01, every 28 days -> 2028-02-29', () => {
    expect(nextDueOn({ kind: 'weight', intervalDays: 28, firstDueOn: '2028-01-01', lastDoneOn: '2028-02-01' })).toBe('2028-02-29')
  })
  describe('testosterone when PSA rises (EAU follow-up, from memory)', () => {
    // Done 2026-02-02, every 168 days: 26 to Feb 28, 31 Mar (57), 30 Apr (87), 31 May (118), 30 Jun (148), 20 into July (168).
    const testosterone = { kind: 'testosterone' as const, intervalDays: 168, firstDueOn: '2026-01-05', lastDoneOn: '2026-02-02' }
    it('without a rise: 2026-07-20', () => {
      expect(nextDueOn(testosterone)).toBe('2026-07-20')
    })
    it('a PSA found rising on 2026-04-10 brings it to that day', () => {
      expect(nextDueOn(testosterone, '2026-04-10')).toBe('2026-04-10')
    })
    it('a rise before the last testosterone changes nothing', () => {
      expect(nextDueOn(testosterone, '2026-01-20')).toBe('2026-07-20')
    })
    it('a rise only moves testosterone, never another item', () => {
      expect(nextDueOn({ ...testosterone, kind: 'psa' }, '2026-04-10')).toBe('2026-07-20')
    })
  })
  it('an older result does not move the last-done date back', () => {
    expect(doneAfter('2026-03-30', '2026-02-01')).toBe('2026-03-30')
    expect(doneAfter('2026-03-30', '2026-04-02')).toBe('2026-04-02')
    expect(doneAfter(null, '2026-04-02')).toBe('2026-04-02')
  })
})

describe('a regimen change: the defaults applied again', () => {
  // On the 1-month depot from 2026-01-05; PSA done 2026-03-30. On 2026-04-27 he moves to the
  // 6-month depot, first given that day, and the clinician applies the defaults again.
  const before = planFromDefaults({ cycleDays: 28, startsOn: '2026-01-05', lastInjectionOn: '2026-03-30' }, '2026-01-05', [])
  const done = before.map(item => (item.kind === 'psa' ? { ...item, lastDoneOn: '2026-03-30', note: 'Lab at the visit' } : item))
  const after = planFromDefaults({ cycleDays: 168, startsOn: '2026-04-27', lastInjectionOn: '2026-04-27' }, '2026-04-27', [], done)

  it('on the 1-month depot, PSA every 84 days: next due 2026-06-22; blood pressure at the next visit, 2026-03-30 + 28 = 2026-04-27', () => {
    expect(nextDueOn(itemOf(done, 'psa'))).toBe('2026-06-22')
    expect(nextDueOn(itemOf(done, 'blood-pressure'))).toBe('2026-04-27')
  })
  it('PSA keeps its last result and note, now every 168 days: 2026-03-30 + 168 = 2026-09-14 (84 to Jun 22, 8 to Jun 30, 31 Jul, 31 Aug, 14 into Sept)', () => {
    expect(itemOf(after, 'psa')).toMatchObject({ intervalDays: 168, lastDoneOn: '2026-03-30', note: 'Lab at the visit' })
    expect(nextDueOn(itemOf(after, 'psa'))).toBe('2026-09-14')
  })
  it('testosterone, never done, is due 84 days after the new start: 2026-04-27 + 84 = 2026-07-20 (3 to Apr 30, 31 May, 30 Jun, 20 into July)', () => {
    expect(nextDueOn(itemOf(after, 'testosterone'))).toBe('2026-07-20')
  })
  it('blood pressure at the next 6-month visit: 2026-04-27 + 168 = 2026-10-12 (3, 31, 30, 31, 31, 30, then 12 into October)', () => {
    expect(itemOf(after, 'blood-pressure').intervalDays).toBe(168)
    expect(nextDueOn(itemOf(after, 'blood-pressure'))).toBe('2026-10-12')
  })
  it('lipids every 336 days on the 6-month depot (two cycles)', () => {
    expect(itemOf(after, 'lipids').intervalDays).toBe(336)
  })
})

describe('who gets which items', () => {
  const regimen = { cycleDays: 84, startsOn: '2026-01-05', lastInjectionOn: '2026-01-05' }
  it('without QT risk factors, ECG and electrolytes start inactive', () => {
    const plan = planFromDefaults(regimen, '2026-01-05', ['diabetes'])
    expect(itemOf(plan, 'ecg').active).toBe(false)
    expect(itemOf(plan, 'electrolytes').active).toBe(false)
    expect(itemOf(plan, 'psa').active).toBe(true)
  })
  it('with heart disease or a long QT they are active', () => {
    expect(itemOf(planFromDefaults(regimen, '2026-01-05', ['heartDisease']), 'ecg').active).toBe(true)
    expect(itemOf(planFromDefaults(regimen, '2026-01-05', ['longQt']), 'electrolytes').active).toBe(true)
  })
  it('applied again, an item keeps the active flag the clinician gave it', () => {
    const first = planFromDefaults(regimen, '2026-01-05', []).map(item => (item.kind === 'vitamin-d' ? { ...item, active: false } : item))
    expect(itemOf(planFromDefaults(regimen, '2026-02-01', [], first), 'vitamin-d').active).toBe(false)
  })
})

describe('due state', () => {
  it.each([
    ['2026-02-09', '2026-02-10', 'overdue'],
    ['2026-02-10', '2026-02-10', 'due-this-month'],
    ['2026-02-28', '2026-02-10', 'due-this-month'],
    ['2026-03-01', '2026-02-10', 'later'],
    ['2028-02-29', '2028-02-03', 'due-this-month'],
    ['2028-03-01', '2028-02-03', 'later'],
    ['2026-12-31', '2026-12-15', 'due-this-month'],
    ['2027-01-01', '2026-12-15', 'later'],
  ])('due %s on %s: %s', (dueOn, today, state) => {
    expect(dueState(dueOn, today)).toBe(state)
  })
})

describe('the sources in both languages', () => {
  it('every source is in the English locale word for word, and translated in Spanish', async () => {
    const en = (await import('../../locales/en.json')).default.monitoring.sources as Record<string, string>
    const es = (await import('../../locales/es.json')).default.monitoring.sources as Record<string, string>
    expect(en).toEqual({ ...MONITORING_SOURCES })
    for (const [key, text] of Object.entries(MONITORING_SOURCES)) expect(es[key], key).not.toBe(text)
    expect(Object.keys(es).sort()).toEqual(Object.keys(MONITORING_SOURCES).sort())
  })
})
