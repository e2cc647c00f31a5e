import { localDate, zonedDateTimeToUtc } from '#shared/schedule/rules'
import type { Language } from '#shared/auth/roles'
import type { ClinicSettings } from '../core/settings'

/*
 * The clinic's clock for the schedule: today in the clinic's time zone, the start of a
 * clinic day, and times and dates written out for the pages and e-mails.
 */

export interface ScheduleClock {
  now: Date
  settings: ClinicSettings
  /** Today in the clinic's time zone. */
  today: string
}

export async function scheduleClock(now = new Date()): Promise<ScheduleClock> {
  const settings = await getSettings()
  return { now, settings, today: localDate(now, settings.timeZone) }
}

/** The first instant of a clinic calendar date. */
export function startOfClinicDay(date: string, timeZone: string): Date {
  return zonedDateTimeToUtc(date, '00:00', timeZone)
}

/** 'HH:mm' of an instant in the clinic's time zone. */
export function clinicClockTime(instant: Date, timeZone: string): string {
  const parts = new Intl.DateTimeFormat('en-GB', { timeZone, hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).formatToParts(instant)
  const part = (type: string) => parts.find(p => p.type === type)?.value ?? '00'
  return `${part('hour')}:${part('minute')}`
}

const LOCALES: Record<Language, string> = { en: 'en-US', es: 'es-US' }

/** An appointment time written out for an e-mail, in the clinic's time zone. */
export function formatAppointmentTime(instant: Date, language: Language, timeZone: string): string {
  return new Intl.DateTimeFormat(LOCALES[language] ?? 'en-US', {
    timeZone, weekday: 'long', year: 'numeric', month: 'long', day: 'numeric', hour: 'numeric', minute: '2-digit', timeZoneName: 'short',
  }).format(instant)
}

/** A calendar date (YYYY-MM-DD) written out for an e-mail. */
export function formatCalendarDate(date: string, language: Language): string {
  return new Intl.DateTimeFormat(LOCALES[language] ?? 'en-US', { timeZone: 'UTC', weekday: 'long', year: 'numeric', month: 'long', day: 'numeric' })
    .format(new Date(`${date}T12:00:00Z`))
}

