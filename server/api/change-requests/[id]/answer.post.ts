import { zonedDateTimeToUtc } from '../../../../shared/clinical/schedule'
import { answerChangeRequestSchema } from '../../../../shared/schemas/schedule'
import { Appointment, AppointmentChangeRequest, User } from '../../../db/models'

/**
 * Staff answer a request for another time: move the appointment (it then waits for the
 * patient's confirmation again) or keep its time. The patient gets an e-mail either way.
 */
export default defineEventHandler(async (event) => {
  await useDb()
  const id = idParam(event)
  const found = id ? await AppointmentChangeRequest.findByPk(id) : null
  const { patient, user } = await authorizePatient(event, found?.patientId ?? 0, 'appointment.schedule')
  const clock = await scheduleClock()
  const input = await readValidatedBody(event, parseWith(answerChangeRequestSchema(clock.today)))
  const request = await AppointmentChangeRequest.findOne({ where: { id, patientId: patient.id } })
  const appointment = request ? await Appointment.findOne({ where: { id: request.appointmentId, patientId: patient.id } }) : null
  if (!request || !appointment) throw createError({ statusCode: 404, message: 'errors.notFound' })
  if (request.status !== 'open') throw createError({ statusCode: 409, message: 'errors.schedule.requestClosed' })
  const tz = clock.settings.timeZone
  const newStart = input.decision === 'move' ? zonedDateTimeToUtc(input.date!, input.time!, tz) : null
  if (newStart && newStart <= clock.now) {
    throw createError({ statusCode: 400, message: 'errors.invalidInput', data: { fieldErrors: { time: ['validation.schedule.pastTime'] } } })
  }
  const patientUser = await User.findByPk(patient.userId)
  const sequelize = await useDb()
  await sequelize.transaction(async (transaction) => {
    await request.update({ status: 'answered', decision: input.decision, answerNote: input.note ?? null, answeredByUserId: user.id, answeredAt: clock.now }, { transaction })
    await appointment.update({
      status: 'booked',
      confirmedAt: null,
      confirmedByUserId: null,
      ...(newStart ? { startsAt: newStart, place: input.place ?? appointment.place, sequence: appointment.sequence + 1 } : {}),
    }, { transaction })
    if (patientUser?.active) {
      const language = patientUser.language
      await enqueueMail({
        to: patientUser.email,
        template: newStart ? 'scheduleChangeMoved' : 'scheduleChangeKept',
        language,
        params: { name: patientUser.name, when: formatAppointmentTime(appointment.startsAt, language, tz), place: appointment.place },
        linkPath: '/today',
        attachments: [calendarAttachment(appointment, { language, settings: clock.settings })],
        dedupeKey: `change-answered:${request.id}`,
      }, transaction)
    }
  })
  return shapeAppointment(appointment, patient.userId, tz)
})
