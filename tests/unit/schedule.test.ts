import { describe, expect, it } from 'vitest'
import {
  DEFAULT_REGIMENS,
  SITES,
  addDays,
  daysBetween,
  flareWatch,
  localDate,
  nextDueDate,
  scheduleStatus,
  sideOf,
  suggestSite,
  zonedDateTimeToUtc,
} from '#shared/schedule/rules'
import type { SiteCode, SiteUse } from '#shared/schedule/rules'

const CHICAGO = 'America/Chicago'
const HOUR = 60 * 60 * 1000

describe('regimens (US prescribing information, section 2; common practice)', () => {
  it('has the four common intervals of 4, 12, 16 and 24 weeks (28, 84, 112 and 168 days)', () => {
    expect(DEFAULT_REGIMENS.map(regimen => regimen.intervalDays)).toEqual([28, 84, 112, 168])
  })

  it('uses generic names, not product names', () => {
    expect(DEFAULT_REGIMENS.map(regimen => regimen.name)).toEqual([
      '1-month depot',
      '3-month depot',
      '4-month depot',
      '6-month depot',
    ])
  })
})

describe('nextDueDate (US prescribing information check values)', () => {
  // Last dose 2025-01-06 -> 2025-02-03 (4 wk), 2025-03-31 (12 wk), 2025-04-28 (16 wk), 2025-06-23 (24 wk).
  it.each([
    [4, '2025-02-03'],
    [12, '2025-03-31'],
    [16, '2025-04-28'],
    [24, '2025-06-23'],
  ])('last dose 2025-01-06 every %i weeks is due on %s', (weeks, expected) => {
    expect(nextDueDate('2025-01-06', weeks * 7)).toBe(expected)
  })

  it('lands on the leap day: 2024-02-01 + 28 days is 2024-02-29', () => {
    expect(nextDueDate('2024-02-01', 28)).toBe('2024-02-29')
  })

  it('refuses an interval that is not a whole number of days', () => {
    expect(() => nextDueDate('2025-01-06', 0)).toThrow(RangeError)
    expect(() => nextDueDate('2025-01-06', 27.5)).toThrow(RangeError)
  })
})

describe('calendar arithmetic', () => {
  it('counts a leap year as 366 days and a common year as 365', () => {
    expect(daysBetween('2024-01-01', '2025-01-01')).toBe(366)
    expect(daysBetween('2025-01-01', '2026-01-01')).toBe(365)
    expect(addDays('2024-02-28', 1)).toBe('2024-02-29')
    expect(addDays('2025-02-28', 1)).toBe('2025-03-01')
    expect(addDays('2024-02-29', 365)).toBe('2025-02-28')
  })

  it('goes backwards and gives negative distances', () => {
    expect(addDays('2025-03-01', -1)).toBe('2025-02-28')
    expect(daysBetween('2025-03-01', '2025-02-28')).toBe(-1)
  })

  it('is not moved by daylight saving: a 28-day interval across 2025-03-09 and 2025-11-02 stays 28 days', () => {
    expect(addDays('2025-02-23', 28)).toBe('2025-03-23')
    expect(addDays('2025-03-08', 1)).toBe('2025-03-09')
    expect(addDays('2025-10-12', 28)).toBe('2025-11-09')
    expect(addDays('2025-11-01', 1)).toBe('2025-11-02')
    expect(daysBetween('2025-03-08', '2025-03-10')).toBe(2)
    expect(daysBetween('2025-11-01', '2025-11-03')).toBe(2)
  })

  it('refuses dates that are not real calendar dates', () => {
    expect(() => addDays('2025-02-30', 1)).toThrow(RangeError)
    expect(() => addDays('2025-2-3', 1)).toThrow(RangeError)
    expect(() => addDays('2025-02-03T10:00', 1)).toThrow(RangeError)
    expect(() => daysBetween('2025-13-01', '2025-01-01')).toThrow(RangeError)
  })
})

describe('clinic time zone (America/Chicago, daylight saving 2025-03-09 and 2025-11-02)', () => {
  it('finds today in the clinic, not in UTC', () => {
    // 05:30 UTC is 23:30 CST the evening before.
    expect(localDate(new Date('2025-03-09T05:30:00Z'), CHICAGO)).toBe('2025-03-08')
    // After the spring change Chicago is UTC-5: 05:30 UTC on 2025-03-10 is 00:30 CDT.
    expect(localDate(new Date('2025-03-10T05:30:00Z'), CHICAGO)).toBe('2025-03-10')
    // 2025-11-02 05:30 UTC is 00:30 CDT; a day later 05:30 UTC is 23:30 CST on 2025-11-02.
    expect(localDate(new Date('2025-11-02T05:30:00Z'), CHICAGO)).toBe('2025-11-02')
    expect(localDate(new Date('2025-11-03T05:30:00Z'), CHICAGO)).toBe('2025-11-02')
  })

  it('places 09:00 at UTC-6 before and UTC-5 after the spring change', () => {
    expect(zonedDateTimeToUtc('2025-03-08', '09:00', CHICAGO).toISOString()).toBe('2025-03-08T15:00:00.000Z')
    expect(zonedDateTimeToUtc('2025-03-09', '09:00', CHICAGO).toISOString()).toBe('2025-03-09T14:00:00.000Z')
  })

  it('places 09:00 at UTC-5 before and UTC-6 after the autumn change', () => {
    expect(zonedDateTimeToUtc('2025-11-01', '09:00', CHICAGO).toISOString()).toBe('2025-11-01T14:00:00.000Z')
    expect(zonedDateTimeToUtc('2025-11-02', '09:00', CHICAGO).toISOString()).toBe('2025-11-02T15:00:00.000Z')
  })

  it('days around a change are 23 and 25 hours long, yet each is one calendar day', () => {
    const spring = zonedDateTimeToUtc('2025-03-10', '00:00', CHICAGO).getTime()
      - zonedDateTimeToUtc('2025-03-09', '00:00', CHICAGO).getTime()
    const autumn = zonedDateTimeToUtc('2025-11-03', '00:00', CHICAGO).getTime()
      - zonedDateTimeToUtc('2025-11-02', '00:00', CHICAGO).getTime()
    expect(spring).toBe(23 * HOUR)
    expect(autumn).toBe(25 * HOUR)
    expect(daysBetween('2025-03-09', '2025-03-10')).toBe(1)
    expect(daysBetween('2025-11-02', '2025-11-03')).toBe(1)
  })

  it('moves a time skipped in spring forward and takes the second of a repeated autumn time', () => {
    // 02:30 does not exist on 2025-03-09: it becomes 03:30 CDT (08:30 UTC).
    expect(zonedDateTimeToUtc('2025-03-09', '02:30', CHICAGO).toISOString()).toBe('2025-03-09T08:30:00.000Z')
    // 01:30 happens twice on 2025-11-02: the CST one (UTC-6) is used.
    expect(zonedDateTimeToUtc('2025-11-02', '01:30', CHICAGO).toISOString()).toBe('2025-11-02T07:30:00.000Z')
  })

  it('keeps an appointment on its calendar date every day of 2025', () => {
    for (let day = 0; day < 365; day += 1) {
      const date = addDays('2025-01-01', day)
      expect(localDate(zonedDateTimeToUtc(date, '09:00', CHICAGO), CHICAGO)).toBe(date)
      expect(localDate(zonedDateTimeToUtc(date, '00:00', CHICAGO), CHICAGO)).toBe(date)
      expect(localDate(zonedDateTimeToUtc(date, '23:59', CHICAGO), CHICAGO)).toBe(date)
    }
  })

  it('refuses an unknown time zone or a malformed time', () => {
    expect(() => localDate(new Date(), 'Nowhere/Atlantis')).toThrow(RangeError)
    expect(() => zonedDateTimeToUtc('2025-03-09', '9:00', CHICAGO)).toThrow(RangeError)
    expect(() => zonedDateTimeToUtc('2025-03-09', '24:00', CHICAGO)).toThrow(RangeError)
  })
})

describe('scheduleStatus: every window boundary (window is a clinic setting; 7 days either side from memory)', () => {
  // 1-month depot: last dose 2025-01-06, due 2025-02-03 (REFERENCES.md check); a window of
  // 7 days either side runs 2025-01-27 to 2025-02-10. Every date below is counted by hand.
  const base = { lastInjectionDate: '2025-01-06', intervalDays: 28 }
  const due = '2025-02-03'
  const stateOn = (today: string, earlyDays?: number, lateDays?: number) =>
    scheduleStatus({ ...base, today, earlyDays, lateDays })

  it('has no due date before the first injection', () => {
    expect(scheduleStatus({ lastInjectionDate: null, intervalDays: 28, today: '2025-01-06' })).toEqual({
      state: 'not-started',
      dueDate: null,
      windowOpens: null,
      windowCloses: null,
      daysToDue: null,
    })
  })

  it('reports the due date and a window of 7 days either side', () => {
    const status = stateOn('2025-01-20')
    expect(status.dueDate).toBe('2025-02-03')
    expect(status.windowOpens).toBe('2025-01-27')
    expect(status.windowCloses).toBe('2025-02-10')
    // 2025-01-20 to 2025-02-03: 11 days left in January + 3 = 14.
    expect(status.daysToDue).toBe(14)
  })

  it.each([
    ['the day of the last injection', '2025-01-06', 'upcoming', 28],
    ['the day before the window opens', '2025-01-26', 'upcoming', 8],
    ['the day the window opens', '2025-01-27', 'window-open', 7],
    ['the day before the due date', '2025-02-02', 'window-open', 1],
    ['the due date', '2025-02-03', 'due-today', 0],
    ['the day after the due date', '2025-02-04', 'late', -1],
    ['the day the window closes', '2025-02-10', 'late', -7],
    ['the day after the window closes', '2025-02-11', 'overdue', -8],
    // 2025-02-03 + 90 days: 25 to 2025-02-28, 31 to 03-31, 30 to 04-30, 4 to 2025-05-04.
    ['months later', '2025-05-04', 'overdue', -90],
  ])('on %s (%s) the state is %s', (_label, today, state, daysToDue) => {
    const status = stateOn(today)
    expect(status.state).toBe(state)
    expect(status.daysToDue).toBe(daysToDue)
  })

  it('follows the clinic window setting', () => {
    // 3 days early, 2 days late: the window is 2025-01-31 to 2025-02-05.
    expect(stateOn('2025-01-31', 3, 2).state).toBe('window-open')
    expect(stateOn('2025-01-30', 3, 2).state).toBe('upcoming')
    expect(stateOn('2025-02-05', 3, 2).state).toBe('late')
    expect(stateOn('2025-02-06', 3, 2).state).toBe('overdue')
  })

  it('with no tolerance the window is the due date alone', () => {
    expect(stateOn('2025-02-02', 0, 0).state).toBe('upcoming')
    expect(stateOn('2025-02-03', 0, 0).state).toBe('due-today')
    expect(stateOn('2025-02-04', 0, 0).state).toBe('overdue')
  })

  it('puts the window across a leap day: 2024-02-01 + 28 days', () => {
    const status = scheduleStatus({ lastInjectionDate: '2024-02-01', intervalDays: 28, today: '2024-02-22' })
    expect(status.dueDate).toBe('2024-02-29')
    expect(status.windowOpens).toBe('2024-02-22')
    expect(status.windowCloses).toBe('2024-03-07')
    expect(status.state).toBe('window-open')
  })

  it('counts days to due across the spring change without losing one (3-month depot)', () => {
    const status = scheduleStatus({ lastInjectionDate: '2024-12-16', intervalDays: 84, today: '2025-03-01' })
    expect(status.dueDate).toBe('2025-03-10')
    expect(status.daysToDue).toBe(9)
    expect(status.state).toBe('upcoming')
  })

  it('refuses a negative tolerance', () => {
    expect(() => stateOn(due, -1, 7)).toThrow(RangeError)
  })
})

describe('suggestSite (REFERENCES: alternate sites between injections)', () => {
  // REFERENCES.md: gluteal area, anterior thigh or deltoid, left and right: six sites.
  const SIX_SITES: SiteCode[] = ['gluteal-left', 'gluteal-right', 'thigh-left', 'thigh-right', 'deltoid-left', 'deltoid-right']
  const side = (site: string) => (site.endsWith('-left') ? 'left' : 'right')

  it('has the six sites of the prescribing information, and sideOf reads their side', () => {
    expect([...SITES].sort()).toEqual([...SIX_SITES].sort())
    expect(SIX_SITES.map(sideOf)).toEqual(['left', 'right', 'left', 'right', 'left', 'right'])
  })

  it('starts with the left gluteal site when there is no history (gluteal, thigh, deltoid order; our design)', () => {
    expect(suggestSite([])).toBe('gluteal-left')
  })

  it('never suggests the last site and always the other side', () => {
    for (const site of SIX_SITES) {
      const suggestion = suggestSite([{ site, date: '2025-01-06' }])
      expect(suggestion).not.toBe(site)
      expect(side(suggestion)).not.toBe(side(site))
    }
  })

  it('prefers a site never used, then the least recently used, on the other side', () => {
    const history: SiteUse[] = [
      { site: 'thigh-right', date: '2024-10-14' },
      { site: 'gluteal-right', date: '2024-11-11' },
      { site: 'gluteal-left', date: '2024-12-09' },
    ]
    // Right side: deltoid-right never used.
    expect(suggestSite(history)).toBe('deltoid-right')
    const used = [...history, { site: 'deltoid-right' as SiteCode, date: '2024-09-16' }]
    // All three right sites used: thigh-right (2024-10-14) is older than gluteal-right.
    expect(suggestSite(used)).toBe('deltoid-right')
    const allUsed = [...history, { site: 'deltoid-right' as SiteCode, date: '2024-11-20' }]
    expect(suggestSite(allUsed)).toBe('thigh-right')
  })

  it('uses the latest date as the last injection whatever the order of the history', () => {
    const history: SiteUse[] = [
      { site: 'deltoid-left', date: '2025-02-03' },
      { site: 'gluteal-right', date: '2025-01-06' },
    ]
    // Last was deltoid-left, so the right side; gluteal-right was used, thigh-right never.
    expect(suggestSite(history)).toBe('thigh-right')
    expect(suggestSite([...history].reverse())).toBe('thigh-right')
  })

  it('rotates through all six sites over 30 injections that follow the suggestion', () => {
    const history: SiteUse[] = []
    let date = '2023-01-02'
    for (let dose = 0; dose < 30; dose += 1) {
      const site = suggestSite(history)
      const last = history.at(-1)
      if (last) {
        expect(site).not.toBe(last.site)
        expect(side(site)).not.toBe(side(last.site))
      }
      history.push({ site, date })
      date = addDays(date, 28)
    }
    const counts = new Map<SiteCode, number>()
    for (const use of history) counts.set(use.site, (counts.get(use.site) ?? 0) + 1)
    expect([...counts.keys()].sort()).toEqual([...SIX_SITES].sort())
    // Six sites, 30 doses: each site five times, and any six doses in a row cover all six.
    for (const site of SIX_SITES) expect(counts.get(site)).toBe(5)
    for (let start = 0; start + 6 <= history.length; start += 1) {
      expect(new Set(history.slice(start, start + 6).map(use => use.site)).size).toBe(6)
    }
  })
})

describe('flareWatch (prescribing information, Warnings; common practice; 28 days is a clinic setting)', () => {
  const first = '2025-01-06'
  // 28 days counting the day of the injection: 2025-01-06 to 2025-02-02 (26 in January + 2).
  const lastDay = '2025-02-02'

  it('ends on the first injection + days - 1 (last day inclusive)', () => {
    expect(flareWatch(first, first)).toEqual({ active: true, startsOn: first, endsOn: lastDay })
  })

  it('is active on the last day and over on the day after', () => {
    expect(flareWatch(first, lastDay).active).toBe(true)
    expect(flareWatch(first, '2025-02-03').active).toBe(false)
  })

  it('is not active before the first injection or without one', () => {
    expect(flareWatch(first, '2025-01-05').active).toBe(false)
    expect(flareWatch(null, first)).toEqual({ active: false, startsOn: null, endsOn: null })
  })

  it('follows the clinic setting for its length', () => {
    // 42 days from 2025-01-06: 26 in January + 16 = 2025-02-16 is the last.
    const watch = flareWatch(first, '2025-02-16', 42)
    expect(watch.endsOn).toBe('2025-02-16')
    expect(watch.active).toBe(true)
    expect(flareWatch(first, '2025-02-17', 42).active).toBe(false)
    expect(() => flareWatch(first, first, 0)).toThrow(RangeError)
  })
})
