import { Op } from 'sequelize'
import { zonedDateTimeToUtc } from '#shared/schedule/rules'
import { scheduleAppointmentSchema } from '#shared/schedule/schemas'
import { OPEN_APPOINTMENT_STATUSES } from '#shared/schedule/statuses'
import { Appointment, AppointmentChangeRequest, User } from '../../../db/models'

/**
 * Books the patient's next appointment (staff). It replaces any open appointment still
 * ahead of him, and the patient gets an e-mail with the calendar file, in his language.
 * The open ones are cancelled by a conditional update in the same transaction (still open
 * when it runs, or 409 and nothing written), so an answer to one of their requests that
 * comes after finds it withdrawn (409) instead of moving a cancelled appointment. With
 * `replaces` (the open appointment the nurse saw, or null), a booking made while another
 * nurse booked or moved it answers 409 and writes nothing: one booking, one e-mail.
 */
export default defineEventHandler(async (event) => {
  const { patient, user } = await authorizePatient(event, idParam(event), 'appointment.schedule')
  const clock = await scheduleClock()
  const input = await readValidatedBody(event, parseWith(scheduleAppointmentSchema(clock.today)))
  const tz = clock.settings.timeZone
  const startsAt = zonedDateTimeToUtc(input.date, input.time, tz)
  if (startsAt <= clock.now) {
    throw fieldError('time', 'validation.schedule.pastTime')
  }
  const sequelize = await useDb()
  const appointment = await sequelize.transaction(async (transaction) => {
    const patientUser = await User.findByPk(patient.userId, { transaction })
    const replaced = await Appointment.findAll({
      where: { patientId: patient.id, ...openFromToday(clock) },
      transaction,
    })
    if (input.replaces !== undefined) {
      const seen = input.replaces === null ? [] : [input.replaces]
      const open = replaced.map(old => old.id)
      if (seen.length !== open.length || !seen.every(id => open.includes(id))) {
        throw createError({ statusCode: 409, message: 'errors.schedule.appointmentChanged' })
      }
    }
    if (replaced.length) {
      const ids = replaced.map(old => old.id)
      const [cancelled] = await Appointment.update({ status: 'cancelled' }, {
        where: { id: { [Op.in]: ids }, patientId: patient.id, status: { [Op.in]: [...OPEN_APPOINTMENT_STATUSES] } },
        transaction,
      })
      if (cancelled !== ids.length) throw createError({ statusCode: 409, message: 'errors.schedule.appointmentChanged' })
      await AppointmentChangeRequest.update({ status: 'withdrawn' }, { where: { appointmentId: { [Op.in]: ids }, patientId: patient.id, status: 'open' }, transaction })
    }
    const created = await Appointment.create({
      patientId: patient.id,
      startsAt,
      durationMinutes: input.durationMinutes,
      place: input.place,
      confirmedAt: null,
      confirmedByUserId: null,
      createdByUserId: user.id,
    }, { transaction })
    if (patientUser?.active) {
      await enqueueMail({
        to: patientUser.email,
        template: 'appointmentBooked',
        language: patientUser.language,
        params: { name: patientUser.name, when: formatAppointmentTime(startsAt, patientUser.language, tz), place: input.place },
        linkPath: '/today',
        attachments: [calendarAttachment(created, { language: patientUser.language, settings: clock.settings })],
        dedupeKey: `appointment-booked:${created.id}`,
      }, transaction)
    }
    return created
  })
  setResponseStatus(event, 201)
  return shapeAppointment(appointment, patient.userId, tz)
})
