import { DateTime } from 'luxon'

/*
 * The injection schedule: next due date, the window around it, the state on a given
 * day, injection-site rotation and the flare watch.
 *
 * Dates are calendar dates written 'YYYY-MM-DD' in the clinic's time zone. Calendar
 * arithmetic is done on dates alone (no clock time), so daylight-saving changes and
 * leap days cannot shift a due date. Use `localDate` to find "today" in the clinic's
 * zone and `zonedDateTimeToUtc` to turn an appointment's local date and time into an
 * instant.
 *
 * Intervals: US prescribing information (section 2, Dosage and administration) of the
 * 1-, 3-, 4- and 6-month GnRH-agonist depot suspensions for prostate cancer; common
 * practice. No published window around the due date was found: the window is a clinic
 * setting (default 7 days either side, from memory of common clinic practice).
 */

/** The six injection sites: gluteal area, anterior thigh and deltoid, left and right. */
export const SITES = [
  'gluteal-left',
  'gluteal-right',
  'thigh-left',
  'thigh-right',
  'deltoid-left',
  'deltoid-right',
] as const

export type SiteCode = (typeof SITES)[number]
export type Side = 'left' | 'right'

export interface Regimen {
  name: string
  intervalDays: number
}

/** The four common regimens; a clinic can add its own. */
export const DEFAULT_REGIMENS: readonly Regimen[] = [
  { name: '1-month depot', intervalDays: 28 },
  { name: '3-month depot', intervalDays: 84 },
  { name: '4-month depot', intervalDays: 112 },
  { name: '6-month depot', intervalDays: 168 },
]

export const SCHEDULE_STATES = [
  'not-started',
  'upcoming',
  'window-open',
  'due-today',
  'late',
  'overdue',
] as const

export type ScheduleState = (typeof SCHEDULE_STATES)[number]

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/
const CLOCK_TIME = /^([01]\d|2[0-3]):[0-5]\d$/
const DATE_FORMAT = 'yyyy-MM-dd'

function parseDate(date: string): DateTime {
  const parsed = ISO_DATE.test(date) ? DateTime.fromISO(date, { zone: 'utc' }) : null
  if (!parsed?.isValid) {
    throw new RangeError(`Expected a calendar date written YYYY-MM-DD, got "${date}"`)
  }
  return parsed
}

function requireWholeDays(value: number, name: string, minimum?: number): void {
  if (!Number.isInteger(value) || (minimum !== undefined && value < minimum)) {
    const floor = minimum === undefined ? '' : ` of at least ${minimum}`
    throw new RangeError(`${name} must be a whole number${floor}, got ${value}`)
  }
}

/** The calendar date `days` days after `date` (before it when `days` is negative). */
export function addDays(date: string, days: number): string {
  requireWholeDays(days, 'days')
  return parseDate(date).plus({ days }).toFormat(DATE_FORMAT)
}

/** Whole calendar days from `from` to `to`: positive when `to` is later. */
export function daysBetween(from: string, to: string): number {
  return Math.round(parseDate(to).diff(parseDate(from), 'days').days)
}

/** The calendar date of an instant in a time zone, e.g. today in the clinic. */
export function localDate(instant: Date, timeZone: string): string {
  const zoned = DateTime.fromJSDate(instant, { zone: timeZone })
  if (!zoned.isValid) {
    throw new RangeError(`Cannot place ${String(instant)} in time zone "${timeZone}": ${zoned.invalidExplanation}`)
  }
  return zoned.toFormat(DATE_FORMAT)
}

/**
 * The instant of a local date and clock time ('HH:mm') in a time zone.
 * A time skipped by the spring daylight-saving change (02:30 in Chicago on 2025-03-09)
 * moves forward by the size of the gap (to 03:30); a time that happens twice in the
 * autumn (01:30 on 2025-11-02) is taken as the second of the two (standard time).
 */
export function zonedDateTimeToUtc(date: string, time: string, timeZone: string): Date {
  parseDate(date)
  if (!CLOCK_TIME.test(time)) {
    throw new RangeError(`Expected a clock time written HH:mm, got "${time}"`)
  }
  const zoned = DateTime.fromISO(`${date}T${time}`, { zone: timeZone })
  if (!zoned.isValid) {
    throw new RangeError(`Cannot place ${date} ${time} in time zone "${timeZone}": ${zoned.invalidExplanation}`)
  }
  return zoned.toJSDate()
}

/** Next due date: the date of the last injection plus the regimen interval. */
export function nextDueDate(lastInjectionDate: string, intervalDays: number): string {
  requireWholeDays(intervalDays, 'intervalDays', 1)
  return addDays(lastInjectionDate, intervalDays)
}

export interface ScheduleInput {
  lastInjectionDate: string | null
  intervalDays: number
  /** Today in the clinic's time zone (see `localDate`). */
  today: string
  /** The window opens this many days before the due date (clinic setting). */
  earlyDays?: number
  /** The window closes this many days after the due date (clinic setting). */
  lateDays?: number
}

export interface ScheduleStatus {
  state: ScheduleState
  dueDate: string | null
  /** First day of the window, inclusive. */
  windowOpens: string | null
  /** Last day of the window, inclusive. */
  windowCloses: string | null
  /** Days from today to the due date; negative once it has passed. */
  daysToDue: number | null
}

/**
 * Where a patient stands on a given day:
 * - not-started: no injection recorded yet;
 * - upcoming: before the window opens;
 * - window-open: from the day the window opens until the day before the due date;
 * - due-today: on the due date;
 * - late: after the due date, up to and including the day the window closes;
 * - overdue: after the window has closed (risk of testosterone escape).
 */
export function scheduleStatus(input: ScheduleInput): ScheduleStatus {
  const { lastInjectionDate, intervalDays, today, earlyDays = 7, lateDays = 7 } = input
  requireWholeDays(earlyDays, 'earlyDays', 0)
  requireWholeDays(lateDays, 'lateDays', 0)
  parseDate(today)

  if (lastInjectionDate === null) {
    return { state: 'not-started', dueDate: null, windowOpens: null, windowCloses: null, daysToDue: null }
  }

  const dueDate = nextDueDate(lastInjectionDate, intervalDays)
  const windowOpens = addDays(dueDate, -earlyDays)
  const windowCloses = addDays(dueDate, lateDays)
  const daysToDue = daysBetween(today, dueDate)

  let state: ScheduleState
  if (today < windowOpens) state = 'upcoming'
  else if (today < dueDate) state = 'window-open'
  else if (today === dueDate) state = 'due-today'
  else if (today <= windowCloses) state = 'late'
  else state = 'overdue'

  return { state, dueDate, windowOpens, windowCloses, daysToDue }
}

export function sideOf(site: SiteCode): Side {
  return site.endsWith('-left') ? 'left' : 'right'
}

export interface SiteUse {
  site: SiteCode
  date: string
}

/**
 * The site to suggest for the next injection (REFERENCES: alternate sites between
 * injections). Rules, in order:
 * 1. never the last site used, and always the other side from it;
 * 2. on that side, the site used least recently (a site never used counts as least
 *    recent);
 * 3. ties go to the first in `SITES` order (gluteal, thigh, deltoid).
 * The last injection is the one with the latest date; of two on the same date, the one
 * later in `history`. With no history the suggestion is the first site in `SITES`.
 */
export function suggestSite(history: readonly SiteUse[]): SiteCode {
  const lastUsedOn = new Map<SiteCode, string>()
  let last: SiteUse | undefined
  for (const use of history) {
    parseDate(use.date)
    const previous = lastUsedOn.get(use.site)
    if (previous === undefined || use.date >= previous) lastUsedOn.set(use.site, use.date)
    if (last === undefined || use.date >= last.date) last = use
  }
  if (last === undefined) return SITES[0]

  const otherSide: Side = sideOf(last.site) === 'left' ? 'right' : 'left'
  const candidates = SITES.filter(site => sideOf(site) === otherSide)
  // Never used sorts as '' (before every date); Array.prototype.sort is stable, so ties
  // keep SITES order.
  const leastRecentFirst = [...candidates].sort((a, b) => {
    const usedA = lastUsedOn.get(a) ?? ''
    const usedB = lastUsedOn.get(b) ?? ''
    return usedA < usedB ? -1 : usedA > usedB ? 1 : 0
  })
  return leastRecentFirst[0] ?? SITES[0]
}

export interface FlareWatch {
  active: boolean
  /** The date of the first injection. */
  startsOn: string | null
  /** The last day of the watch, inclusive: first injection + days - 1. */
  endsOn: string | null
}

/**
 * The flare watch: the first weeks after the first injection, when a testosterone surge
 * can worsen bone pain, block the urinary tract or press on the spinal cord
 * (prescribing information, Warnings; common practice). It runs for `days` calendar
 * days counting the day of the first injection as day 1, so with the default 28 days
 * a first injection on 2025-01-06 is watched to 2025-02-02 inclusive.
 */
export function flareWatch(firstInjectionDate: string | null, today: string, days = 28): FlareWatch {
  requireWholeDays(days, 'days', 1)
  parseDate(today)
  if (firstInjectionDate === null) return { active: false, startsOn: null, endsOn: null }

  const endsOn = addDays(firstInjectionDate, days - 1)
  const active = today >= firstInjectionDate && today <= endsOn
  return { active, startsOn: firstInjectionDate, endsOn }
}
