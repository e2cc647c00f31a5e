import type { H3Event } from 'h3'
import { createError } from 'h3'
import { createEvent } from 'ics'
import { Op } from 'sequelize'
import type { Transaction } from 'sequelize'
import { flareWatch, localDate, scheduleStatus, suggestSite, zonedDateTimeToUtc } from '#shared/clinical/schedule'
import { OPEN_APPOINTMENT_STATUSES } from '#shared/scheduling/types'
import type { AppointmentView, ScheduleView } from '#shared/types/schedule'
import type { Language } from '#shared/types/roles'
import { Appointment, AppointmentChangeRequest, Injection, PatientRegimen, Regimen } from '../db/models'
import type { PatientAction, PatientAccess } from './access'
import type { ClinicSettings } from './settings'

/*
 * The injection schedule on the server: where a patient stands today (from the clinical
 * core in shared/clinical/schedule.ts), his next appointment shaped for the pages, the
 * appointment's calendar file, and dates written out for e-mails.
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

export async function currentRegimenOf(patientId: number, transaction?: Transaction) {
  return PatientRegimen.findOne({
    where: { patientId, endsOn: { [Op.is]: null } },
    include: [{ model: Regimen, as: 'regimen' }],
    order: [['startsOn', 'DESC'], ['id', 'DESC']],
    transaction,
  })
}

/**
 * The patient's next open appointment: the first one from the start of today (clinic
 * time), so an appointment earlier today still shows until the injection is recorded.
 * withChangeRequests reads his requests for it in the same query (for shapeAppointment).
 */
export async function nextAppointmentOf(patientId: number, clock: ScheduleClock, transaction?: Transaction, options: { withChangeRequests?: boolean } = {}) {
  return Appointment.findOne({
    where: {
      patientId,
      status: { [Op.in]: [...OPEN_APPOINTMENT_STATUSES] },
      startsAt: { [Op.gte]: startOfClinicDay(clock.today, clock.settings.timeZone) },
    },
    include: options.withChangeRequests
      ? [{ model: AppointmentChangeRequest, as: 'changeRequests', where: { patientId }, required: false }]
      : [],
    order: [['startsAt', 'ASC'], ['id', 'ASC']],
    transaction,
  })
}

/** What the standing is made from: the current plan and every injection given, oldest first. */
interface StandingFacts {
  plan: PatientRegimen | null
  injections: Injection[]
}

/** Where one patient stands on the clock's day, from his facts (no I/O). */
function standingOf({ plan, injections }: StandingFacts, clock: ScheduleClock) {
  const first = injections[0]
  const last = injections.at(-1)
  // The dose last given sets the next due date; the plan only when none was given yet.
  const intervalDays = last?.regimen?.intervalDays ?? plan?.regimen?.intervalDays ?? 28
  const status = scheduleStatus({
    lastInjectionDate: last?.givenOn ?? null,
    intervalDays,
    today: clock.today,
    earlyDays: clock.settings.windowEarlyDays,
    lateDays: clock.settings.windowLateDays,
  })
  return {
    regimen: plan?.regimen
      ? { id: plan.regimen.id, name: plan.regimen.name, intervalDays: plan.regimen.intervalDays, startsOn: plan.startsOn }
      : null,
    lastInjection: last ? { date: last.givenOn, site: last.site, regimenName: last.regimen?.name ?? '' } : null,
    ...status,
    suggestedSite: suggestSite(injections.map(i => ({ site: i.site, date: i.givenOn }))),
    flareWatch: flareWatch(first?.givenOn ?? null, clock.today, clock.settings.flareWatchDays),
  }
}

export type PatientStanding = ReturnType<typeof standingOf>

/**
 * Where the patients stand on the clock's day, without the appointment: one function for
 * the schedule page, the triage item, the due list and the daily sweeps. Two queries
 * whatever the number of patients: their current plans and their injections (each with
 * its regimen). Every id asked for is in the answer (with no plan and no injection, he
 * has not started).
 */
export async function computeSchedules(patientIds: readonly number[], clock: ScheduleClock, transaction?: Transaction): Promise<Map<number, PatientStanding>> {
  const ids = [...new Set(patientIds)]
  const facts = new Map<number, StandingFacts>(ids.map(id => [id, { plan: null, injections: [] }]))
  if (!ids.length) return new Map()
  const [plans, injections] = await Promise.all([
    PatientRegimen.findAll({
      where: { patientId: ids, endsOn: { [Op.is]: null } },
      include: [{ model: Regimen, as: 'regimen' }],
      order: [['startsOn', 'ASC'], ['id', 'ASC']],
      transaction,
    }),
    Injection.findAll({
      where: { patientId: ids },
      attributes: ['id', 'patientId', 'regimenId', 'givenAt', 'givenOn', 'site'],
      include: [{ model: Regimen, as: 'regimen', attributes: ['id', 'name', 'intervalDays'] }],
      order: [['givenAt', 'ASC'], ['id', 'ASC']],
      transaction,
    }),
  ])
  // Plans come oldest first, so the one kept is the current plan (latest start, then latest id).
  for (const plan of plans) facts.get(plan.patientId)!.plan = plan
  for (const injection of injections) facts.get(injection.patientId)!.injections.push(injection)
  return new Map([...facts].map(([id, f]) => [id, standingOf(f, clock)]))
}

/** Where one patient stands on the clock's day, without the appointment. */
export async function computeSchedule(patientId: number, clock: ScheduleClock, transaction?: Transaction): Promise<PatientStanding> {
  return (await computeSchedules([patientId], clock, transaction)).get(patientId)!
}

/** The appointment as the pages see it, with who confirmed or asked (when not the patient). */
export async function shapeAppointment(appointment: Appointment, patientUserId: number, timeZone: string, transaction?: Transaction): Promise<AppointmentView> {
  // patientScheduleView reads the requests with the appointment; the other callers here.
  const preloaded = (appointment as Appointment & { changeRequests?: AppointmentChangeRequest[] }).changeRequests
  const requests = preloaded
    ? [...preloaded].sort((a, b) => b.createdAt.getTime() - a.createdAt.getTime() || b.id - a.id)
    : await AppointmentChangeRequest.findAll({
        where: { appointmentId: appointment.id, patientId: appointment.patientId },
        order: [['createdAt', 'DESC'], ['id', 'DESC']],
        transaction,
      })
  const open = requests.find(r => r.status === 'open') ?? null
  const answered = requests.find(r => r.status === 'answered') ?? null
  // One read for everyone named: who confirmed, who asked and who answered.
  const by = await attributionLookup(patientUserId, [appointment.confirmedByUserId, open?.requestedByUserId, answered?.answeredByUserId])
  const answeredBy = answered?.answeredByUserId ? by(answered.answeredByUserId) : null
  const endsAt = new Date(appointment.startsAt.getTime() + appointment.durationMinutes * 60_000)
  return {
    id: appointment.id,
    startsAt: appointment.startsAt.toISOString(),
    endsAt: endsAt.toISOString(),
    localDate: localDate(appointment.startsAt, timeZone),
    localTime: clinicClockTime(appointment.startsAt, timeZone),
    durationMinutes: appointment.durationMinutes,
    place: appointment.place,
    status: appointment.status,
    confirmedAt: appointment.confirmedAt?.toISOString() ?? null,
    confirmedBy: by(appointment.confirmedByUserId),
    openRequest: open
      ? { id: open.id, preferredDates: open.preferredDates, note: open.note, createdAt: open.createdAt.toISOString(), requestedBy: by(open.requestedByUserId) }
      : null,
    lastAnswer: answered && answered.decision && answered.answeredAt
      ? { decision: answered.decision, note: answered.answerNote, answeredAt: answered.answeredAt.toISOString(), answeredBy: answeredBy?.name ?? '' }
      : null,
  }
}

/** What the person asking may do with this schedule. */
export function scheduleAbilities(access: PatientAccess): ScheduleView['can'] {
  const role = access.user.role
  return {
    respond: access.relation === 'self' || (access.relation === 'caregiver' && Boolean(access.grant?.canManageAppointments)),
    schedule: access.relation === 'staff',
    record: access.relation === 'staff' && (role === 'nurse' || role === 'clinician'),
  }
}

export async function patientScheduleView(access: PatientAccess, clock: ScheduleClock): Promise<ScheduleView> {
  const patientId = access.patient.id
  const [schedule, next] = await Promise.all([
    computeSchedule(patientId, clock),
    nextAppointmentOf(patientId, clock, undefined, { withChangeRequests: true }),
  ])
  return {
    patientId,
    today: clock.today,
    timeZone: clock.settings.timeZone,
    ...schedule,
    nextAppointment: next ? await shapeAppointment(next, access.patient.userId, clock.settings.timeZone) : null,
    can: scheduleAbilities(access),
  }
}

/**
 * Loads the appointment named in the route and authorises one action on its patient.
 * An appointment that does not exist, or whose patient the user may not see, answers 404.
 */
export async function authorizeAppointment(event: H3Event, action: PatientAction) {
  await useDb()
  const id = idParam(event)
  const found = id ? await Appointment.findByPk(id) : null
  const access = await authorizePatient(event, found?.patientId ?? 0, action)
  const appointment = await Appointment.findOne({ where: { id, patientId: access.patient.id } })
  if (!appointment) throw createError({ statusCode: 404, message: 'errors.notFound' })
  return { access, appointment }
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

/** Only an open appointment that has not started yet can be confirmed or changed (409 otherwise). */
export function assertAppointmentOpen(appointment: Appointment, now: Date) {
  if (!(OPEN_APPOINTMENT_STATUSES as readonly string[]).includes(appointment.status)) {
    throw createError({ statusCode: 409, message: 'errors.schedule.appointmentClosed' })
  }
  if (appointment.startsAt <= now) throw createError({ statusCode: 409, message: 'errors.schedule.appointmentPast' })
}
