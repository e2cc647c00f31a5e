import { createEvent } from 'ics'
import type { Language } from '#shared/auth/roles'
import type { Appointment } from '../../db/models'
import { formatAppointmentTime } from './clock'
import type { ClinicSettings } from '../core/settings'

/**
 * The appointment as an iCalendar (RFC 5545) file, made with the `ics` package. Start and
 * end are written in UTC (RFC 5545 "date with UTC time"), which every calendar shows in
 * its own zone; the description repeats the time in the clinic's zone. The UID stays the
 * same and SEQUENCE grows when the appointment moves, so a calendar updates the event.
 */
export function appointmentCalendar(appointment: Appointment, options: { language: Language, settings: ClinicSettings }): string {
  const { language, settings } = options
  const link = new URL('/today', useRuntimeConfig().publicUrl)
  const when = formatAppointmentTime(appointment.startsAt, language, settings.timeZone)
  const start = appointment.startsAt.getTime()
  const { error, value } = createEvent({
    productId: 'tidewell/schedule',
    method: 'PUBLISH',
    uid: `appointment-${appointment.id}@${link.hostname}`,
    sequence: appointment.sequence,
    start,
    startInputType: 'utc',
    startOutputType: 'utc',
    end: start + appointment.durationMinutes * 60_000,
    endInputType: 'utc',
    endOutputType: 'utc',
    title: translate(language, 'schedule.calendar.summary', { clinic: settings.clinicName }),
    description: translate(language, 'schedule.calendar.description', { when, link: link.toString() }),
    location: appointment.place,
    status: appointment.status === 'confirmed' ? 'CONFIRMED' : 'TENTATIVE',
    busyStatus: 'BUSY',
  })
  if (error || !value) throw error ?? new Error('calendar file could not be made')
  return value
}

export const CALENDAR_CONTENT_TYPE = 'text/calendar; charset=utf-8; method=PUBLISH'

/** The calendar file as an e-mail attachment. */
export function calendarAttachment(appointment: Appointment, options: { language: Language, settings: ClinicSettings }) {
  return { filename: 'tidewell-appointment.ics', contentType: CALENDAR_CONTENT_TYPE, content: appointmentCalendar(appointment, options) }
}
