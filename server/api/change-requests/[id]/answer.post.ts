import { zonedDateTimeToUtc } from '#shared/schedule/rules'
import { answerChangeRequestSchema } from '#shared/schedule/schemas'
import { OPEN_APPOINTMENT_STATUSES } from '#shared/schedule/statuses'
import type { Transaction } from 'sequelize'
import { Appointment, AppointmentChangeRequest, User } from '../../../db/models'

/** The appointment, when the closed request already holds exactly this answer from this user. */
async function sameAnswerAgain(
  requestId: number,
  input: { decision: string, place?: string, note?: string },
  newStart: Date | null,
  userId: number,
  transaction: Transaction,
) {
  const stored = await AppointmentChangeRequest.findByPk(requestId, { transaction })
  if (!stored || stored.status !== 'answered' || stored.answeredByUserId !== userId) return null
  if (stored.decision !== input.decision || stored.answerNote !== (input.note ?? null)) return null
  const appointment = await Appointment.findOne({ where: { id: stored.appointmentId, patientId: stored.patientId }, transaction })
  if (!appointment) return null
  if (newStart && (appointment.startsAt.getTime() !== newStart.getTime() || appointment.place !== (input.place ?? appointment.place))) return null
  return appointment
}

/**
 * Staff answer a request for another time: move the appointment (it then waits for the
 * patient's confirmation again) or keep its time. The patient gets an e-mail either way.
 * Only one answer wins: the request is closed by a conditional update (WHERE status is
 * open) and the appointment changed only at the version read in the same transaction, so
 * a second answer at the same moment gets 409 and writes nothing, and the e-mail and its
 * calendar file are made from the appointment as stored. The same nurse sending the same
 * answer again (a retry after a lost reply) gets 200 and the appointment, with no second
 * e-mail.
 */
export default defineEventHandler(async (event) => {
  await useDb()
  const id = idParam(event)
  const found = id ? await AppointmentChangeRequest.findByPk(id) : null
  const { patient, user } = await authorizePatient(event, found?.patientId ?? 0, 'appointment.schedule')
  const clock = await scheduleClock()
  const input = await readValidatedBody(event, parseWith(answerChangeRequestSchema(clock.today)))
  const request = await AppointmentChangeRequest.findOne({ where: { id, patientId: patient.id } })
  if (!request) throw createError({ statusCode: 404, message: 'errors.notFound' })
  const tz = clock.settings.timeZone
  const newStart = input.decision === 'move' ? zonedDateTimeToUtc(input.date!, input.time!, tz) : null
  if (newStart && newStart <= clock.now) {
    throw fieldError('time', 'validation.schedule.pastTime')
  }
  const sequelize = await useDb()
  const appointment = await sequelize.transaction(async (transaction) => {
    const [answered] = await AppointmentChangeRequest.update(
      { status: 'answered', decision: input.decision, answerNote: input.note ?? null, answeredByUserId: user.id, answeredAt: clock.now },
      { where: { id: request.id, patientId: patient.id, status: 'open' }, transaction },
    )
    if (!answered) {
      const retried = await sameAnswerAgain(request.id, input, newStart, user.id, transaction)
      if (retried) return retried
      throw createError({ statusCode: 409, message: 'errors.schedule.requestClosed' })
    }
    const current = await Appointment.findOne({ where: { id: request.appointmentId, patientId: patient.id }, transaction })
    if (!current || !(OPEN_APPOINTMENT_STATUSES as readonly string[]).includes(current.status)) {
      throw createError({ statusCode: 409, message: 'errors.schedule.appointmentClosed' })
    }
    const [changed] = await Appointment.update({
      status: 'booked',
      confirmedAt: null,
      confirmedByUserId: null,
      ...(newStart ? { startsAt: newStart, place: input.place ?? current.place, sequence: current.sequence + 1 } : {}),
    }, { where: { id: current.id, status: current.status, sequence: current.sequence }, transaction })
    if (!changed) throw createError({ statusCode: 409, message: 'errors.schedule.appointmentChanged' })
    await current.reload({ transaction })
    const patientUser = await User.findByPk(patient.userId, { transaction })
    if (patientUser?.active) {
      const language = patientUser.language
      await enqueueMail({
        to: patientUser.email,
        template: newStart ? 'scheduleChangeMoved' : 'scheduleChangeKept',
        language,
        params: { name: patientUser.name, when: formatAppointmentTime(current.startsAt, language, tz), place: current.place },
        linkPath: '/today',
        attachments: [calendarAttachment(current, { language, settings: clock.settings })],
        dedupeKey: `change-answered:${request.id}`,
      }, transaction)
    }
    return current
  })
  return shapeAppointment(appointment, patient.userId, tz)
})
