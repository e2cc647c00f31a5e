import { zonedDateTimeToUtc } from '#shared/schedule/rules'
import { visitAfterSchema } from '#shared/visit/schemas'

/**
 * After the dose: the observation note (any reaction) and, in the same step, the next
 * appointment, which must fall inside the next window (400 on next.date otherwise). Once.
 */
export default defineEventHandler(async (event) => {
  const { patient, user } = await authorizePatient(event, idParam(event), 'injection.record')
  const clock = await scheduleClock()
  const input = await readValidatedBody(event, parseWith(visitAfterSchema(clock.today)))
  const sequelize = await useDb()
  const visit = await sequelize.transaction(async (transaction) => {
    const visit = await findVisit(event, patient, transaction)
    if (visit.status !== 'given') throw createError({ statusCode: 409, message: 'errors.visit.notGiven' })
    if (visit.nextAppointmentId) throw createError({ statusCode: 409, message: 'errors.visit.alreadyBooked' })
    const standing = await computeSchedule(patient.id, clock, transaction)
    if (!standing.windowOpens || !standing.windowCloses || input.next.date < standing.windowOpens || input.next.date > standing.windowCloses) {
      throw fieldError('next.date', 'validation.visit.nextOutsideWindow')
    }
    const appointment = await bookAppointment({
      patient,
      user,
      startsAt: zonedDateTimeToUtc(input.next.date, input.next.time, clock.settings.timeZone),
      durationMinutes: 30,
      place: input.next.place,
    }, clock, transaction)
    return visit.update({ observationNote: input.observationNote ?? null, nextAppointmentId: appointment.id }, { transaction })
  })
  return visitView(visit, patient, clock)
})
