import { AppointmentChangeRequest } from '../../../db/models'

/**
 * The patient (or a caregiver he allowed) confirms the appointment. Confirming again
 * changes nothing; confirming withdraws his open request for another time.
 */
export default defineEventHandler(async (event) => {
  const { access, appointment } = await authorizeAppointment(event, 'appointment.respond')
  const clock = await scheduleClock()
  assertAppointmentOpen(appointment, clock.now)
  if (appointment.status !== 'confirmed') {
    const sequelize = await useDb()
    await sequelize.transaction(async (transaction) => {
      await AppointmentChangeRequest.update({ status: 'withdrawn' }, {
        where: { appointmentId: appointment.id, patientId: access.patient.id, status: 'open' },
        transaction,
      })
      await appointment.update({ status: 'confirmed', confirmedAt: clock.now, confirmedByUserId: access.user.id }, { transaction })
    })
  }
  return shapeAppointment(appointment, access.patient.userId, clock.settings.timeZone)
})
