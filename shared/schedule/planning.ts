import { addDays, daysBetween } from './rules'
import type { ScheduleStatus } from './rules'
import type { DueGroup } from './statuses'

/*
 * Small planning rules around the clinical schedule (shared/schedule/rules.ts): which
 * due-list group a patient falls in, which days to offer for an appointment, and which
 * reminder to send. Pure functions of calendar dates written YYYY-MM-DD.
 */

/** Days ahead that count as "due this week" (today and the next six days). */
export const THIS_WEEK_DAYS = 7
/** "Next two weeks": the fourteen days after this week. */
export const NEXT_TWO_WEEKS_DAYS = 14
/** A patient with no appointment gets one "please book" e-mail this many days before his due date. */
export const PLEASE_BOOK_DAYS = 10

/** The due-list group of a patient's schedule, or null when he is not due for a while. */
export function dueGroup(status: Pick<ScheduleStatus, 'state' | 'daysToDue'>): DueGroup | null {
  if (status.state === 'not-started') return 'not-started'
  if (status.state === 'overdue') return 'overdue'
  if (status.state === 'late') return 'late'
  const days = status.daysToDue ?? Number.POSITIVE_INFINITY
  if (days < THIS_WEEK_DAYS) return 'this-week'
  if (days < THIS_WEEK_DAYS + NEXT_TWO_WEEKS_DAYS) return 'next-two-weeks'
  return null
}

/** Monday to Friday. */
export function isWeekday(date: string): boolean {
  const day = new Date(`${date}T12:00:00Z`).getUTCDay()
  return day >= 1 && day <= 5
}

export interface SlotWindow {
  today: string
  dueDate: string | null
  windowOpens: string | null
  windowCloses: string | null
}

/**
 * Weekdays to offer for the next appointment, best first: inside the window (never before
 * tomorrow), nearest the due date first, earlier before later on a tie. With no due date
 * (not started) or a window already closed, the next working days from tomorrow.
 */
export function candidateDates(window: SlotWindow, fallbackDays = 10): string[] {
  const tomorrow = addDays(window.today, 1)
  const { dueDate, windowOpens, windowCloses } = window
  if (!dueDate || !windowOpens || !windowCloses || windowCloses < tomorrow) {
    return Array.from({ length: fallbackDays }, (_, i) => addDays(tomorrow, i)).filter(isWeekday)
  }
  const first = windowOpens > tomorrow ? windowOpens : tomorrow
  const dates = Array.from({ length: daysBetween(first, windowCloses) + 1 }, (_, i) => addDays(first, i)).filter(isWeekday)
  const distance = (date: string) => Math.abs(daysBetween(date, dueDate))
  return dates.sort((a, b) => distance(a) - distance(b) || (a < b ? -1 : 1))
}

/**
 * Up to `count` free slots: on each candidate date, the first clinic time not already
 * taken (taken holds 'YYYY-MM-DD HH:mm' in the clinic's time zone).
 */
export function pickSlots(dates: readonly string[], times: readonly string[], taken: ReadonlySet<string>, count: number) {
  const slots: { date: string, time: string }[] = []
  for (const date of dates) {
    const time = times.find(candidate => !taken.has(`${date} ${candidate}`))
    if (time) slots.push({ date, time })
    if (slots.length >= count) break
  }
  return slots
}

/**
 * Which reminder an appointment `daysUntil` days away is due for, given the clinic's lead
 * days (e.g. [7, 1]): the smallest lead that is at least daysUntil, so a daily run sends
 * each reminder on its day, and a run that missed a day still sends the one that applies.
 * Null on the day itself or when it is further away than every lead.
 */
export function reminderLead(daysUntil: number, leadDays: readonly number[]): number | null {
  if (daysUntil < 1) return null
  const leads = [...new Set(leadDays)].filter(lead => Number.isInteger(lead) && lead >= 1).sort((a, b) => a - b)
  return leads.find(lead => lead >= daysUntil) ?? null
}
