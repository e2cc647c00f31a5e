import { zonedDateTimeToUtc } from '#shared/schedule/rules'
import { scheduleAppointmentSchema } from '#shared/schedule/schemas'

/** Books the patient's next appointment (staff; bookAppointment says how). */
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
  const appointment = await sequelize.transaction(transaction => bookAppointment({
    patient,
    user,
    startsAt,
    durationMinutes: input.durationMinutes,
    place: input.place,
    replaces: input.replaces,
  }, clock, transaction))
  setResponseStatus(event, 201)
  return shapeAppointment(appointment, patient.userId, tz)
})
