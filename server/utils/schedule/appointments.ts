import { createError } from 'h3'
import { Op } from 'sequelize'
import type { Transaction } from 'sequelize'
import { localDate } from '#shared/schedule/rules'
import { OPEN_APPOINTMENT_STATUSES } from '#shared/schedule/statuses'
import type { AppointmentView, CancelledAppointmentView, ScheduleView } from '#shared/schedule/views'
import type { Patient } from '../../db/models'
import { Appointment, AppointmentChangeRequest, User } from '../../db/models'
import type { PatientAccess } from '../auth/access'
import type { ScheduleClock } from './clock'
import { clinicClockTime, startOfClinicDay } from './clock'
import { computeSchedule } from './standing'

/*
 * The appointment as the pages see it: the patient's next open appointment, its view with
 * who confirmed or asked, the schedule page's whole answer, and the open-appointment check.
 */

/**
 * The patient's next open appointment: the first one from the start of today (clinic
 * time), so an appointment earlier today still shows until the injection is recorded.
 * withChangeRequests reads his requests for it in the same query (for shapeAppointment).
 */
export async function nextAppointmentOf(patientId: number, clock: ScheduleClock, transaction?: Transaction, options: { withChangeRequests?: boolean } = {}) {
  return Appointment.findOne({
    where: { patientId, ...openFromToday(clock) },
    include: options.withChangeRequests
      ? [{ model: AppointmentChangeRequest, as: 'changeRequests', where: { patientId }, required: false }]
      : [],
    order: [['startsAt', 'ASC'], ['id', 'ASC']],
    transaction,
  })
}

/** Every patient's next open appointment (the due list), by patient id: one query, the rule of nextAppointmentOf. */
export async function nextAppointmentsOf(clock: ScheduleClock): Promise<Map<number, Appointment>> {
  const appointments = await Appointment.findAll({
    where: openFromToday(clock),
    attributes: ['id', 'patientId', 'startsAt', 'status'],
    order: [['startsAt', 'DESC'], ['id', 'DESC']],
  })
  // Later rows overwrite earlier ones: the next appointment.
  return new Map(appointments.map(a => [a.patientId, a]))
}

/** The open appointments from the start of today (clinic time): those a patient still has ahead. */
export function openFromToday(clock: ScheduleClock) {
  return {
    status: { [Op.in]: [...OPEN_APPOINTMENT_STATUSES] },
    startsAt: { [Op.gte]: startOfClinicDay(clock.today, clock.settings.timeZone) },
  }
}

/** The appointment as the pages see it, with who confirmed or asked (when not the patient). */
export async function shapeAppointment(appointment: Appointment, patientUserId: number, timeZone: string, transaction?: Transaction): Promise<AppointmentView> {
  // patientScheduleView reads the requests with the appointment; the other callers here.
  const preloaded = appointment.changeRequests
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
      ? { id: open.id, kind: open.kind, preferredDates: open.preferredDates, note: open.note, createdAt: open.createdAt.toISOString(), requestedBy: by(open.requestedByUserId) }
      : null,
    lastAnswer: answered && answered.decision && answered.answeredAt
      ? { decision: answered.decision, note: answered.answerNote, answeredAt: answered.answeredAt.toISOString(), answeredBy: answeredBy?.name ?? '' }
      : null,
  }
}

/** What the person asking may do with this schedule: the access policy's answers, nothing rebuilt. */
export function scheduleAbilities(access: PatientAccess): ScheduleView['can'] {
  return {
    respond: access.allows('appointment.respond'),
    schedule: access.allows('appointment.schedule'),
    record: access.allows('injection.record'),
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
    lastCancelled: next ? null : await lastCancelledOf(patientId, clock),
    can: scheduleAbilities(access),
  }
}

const CANCELLED_SHOWN_DAYS = 30

/** The last appointment the clinic cancelled (with a reason) in the past 30 days, for Today. */
async function lastCancelledOf(patientId: number, clock: ScheduleClock): Promise<CancelledAppointmentView | null> {
  const cancelled = await Appointment.findOne({
    where: { patientId, status: 'cancelled', cancelledAt: { [Op.gte]: new Date(clock.now.getTime() - CANCELLED_SHOWN_DAYS * 86_400_000) } },
    order: [['cancelledAt', 'DESC'], ['id', 'DESC']],
  })
  if (!cancelled?.cancelledAt) return null
  const timeZone = clock.settings.timeZone
  return {
    id: cancelled.id,
    localDate: localDate(cancelled.startsAt, timeZone),
    localTime: clinicClockTime(cancelled.startsAt, timeZone),
    reason: cancelled.cancelReason,
    cancelledAt: cancelled.cancelledAt.toISOString(),
  }
}

/** Only an open appointment that has not started yet can be confirmed or changed (409 otherwise). */
export function assertAppointmentOpen(appointment: Appointment, now: Date) {
  if (!(OPEN_APPOINTMENT_STATUSES as readonly string[]).includes(appointment.status)) {
    throw createError({ statusCode: 409, message: 'errors.schedule.appointmentClosed' })
  }
  if (appointment.startsAt <= now) throw createError({ statusCode: 409, message: 'errors.schedule.appointmentPast' })
}

/** An appointment to book: for whom, by whom, when, how long and where. */
export interface Booking {
  patient: Patient
  user: { id: number }
  startsAt: Date
  durationMinutes: number
  place: string
  /** The open appointment the nurse saw (null: none); undefined: do not check. */
  replaces?: number | null
}

/**
 * Books the patient's next appointment inside the caller's transaction. It replaces any
 * open appointment still ahead of him, and the patient gets an e-mail with the calendar
 * file, in his language. The open ones are cancelled by a conditional update (still open
 * when it runs, or 409 and nothing written), so an answer to one of their requests that
 * comes after finds it withdrawn (409) instead of moving a cancelled appointment. With
 * `replaces`, a booking made while another nurse booked or moved it answers 409 and
 * writes nothing: one booking, one e-mail.
 */
export async function bookAppointment(booking: Booking, clock: ScheduleClock, transaction: Transaction): Promise<Appointment> {
  const patientUser = await User.findByPk(booking.patient.userId, { transaction })
  const replaced = await Appointment.findAll({
    where: { patientId: booking.patient.id, ...openFromToday(clock) },
    transaction,
  })
  if (booking.replaces !== undefined) {
    const seen = booking.replaces === null ? [] : [booking.replaces]
    const open = replaced.map(old => old.id)
    if (seen.length !== open.length || !seen.every(id => open.includes(id))) {
      throw createError({ statusCode: 409, message: 'errors.schedule.appointmentChanged' })
    }
  }
  if (replaced.length) {
    const ids = replaced.map(old => old.id)
    const [cancelled] = await Appointment.update({ status: 'cancelled' }, {
      where: { id: { [Op.in]: ids }, patientId: booking.patient.id, status: { [Op.in]: [...OPEN_APPOINTMENT_STATUSES] } },
      transaction,
    })
    if (cancelled !== ids.length) throw createError({ statusCode: 409, message: 'errors.schedule.appointmentChanged' })
    await AppointmentChangeRequest.update({ status: 'withdrawn' }, { where: { appointmentId: { [Op.in]: ids }, patientId: booking.patient.id, status: 'open' }, transaction })
  }
  const created = await Appointment.create({
    patientId: booking.patient.id,
    startsAt: booking.startsAt,
    durationMinutes: booking.durationMinutes,
    place: booking.place,
    confirmedAt: null,
    confirmedByUserId: null,
    createdByUserId: booking.user.id,
  }, { transaction })
  if (patientUser?.active) {
    await enqueueMail({
      ...mailTo(patientUser),
      template: 'appointmentBooked',
      params: { name: patientUser.name, when: formatAppointmentTime(booking.startsAt, patientUser.language, clock.settings.timeZone), place: booking.place },
      linkPath: '/today',
      attachments: [calendarAttachment(created, { language: patientUser.language, settings: clock.settings })],
      dedupeKey: `appointment-booked:${created.id}`,
    }, transaction)
  }
  return created
}
