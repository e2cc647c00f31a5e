import { Op } from 'sequelize'
import { Appointment, AppointmentChangeRequest } from '../../../db/models'

/**
 * The patient (or a caregiver he allowed) confirms the appointment. The confirmation is a
 * conditional update (only a booked or change-requested appointment that has not started),
 * so two confirmations at once store one; confirming again changes nothing; confirming
 * withdraws his open request for another time. A closed or started one answers 409.
 */
export default defineEventHandler(async (event) => {
  const { access, appointment } = await authorizeAppointment(event, 'appointment.respond')
  const clock = await scheduleClock()
  const sequelize = await useDb()
  await sequelize.transaction(async (transaction) => {
    const [confirmed] = await Appointment.update({ status: 'confirmed', confirmedAt: clock.now, confirmedByUserId: access.user.id }, {
      where: { id: appointment.id, patientId: access.patient.id, status: { [Op.in]: ['booked', 'change-requested'] }, startsAt: { [Op.gt]: clock.now } },
      transaction,
    })
    if (confirmed) {
      await AppointmentChangeRequest.update({ status: 'withdrawn' }, {
        where: { appointmentId: appointment.id, patientId: access.patient.id, status: 'open' },
        transaction,
      })
      return
    }
    await appointment.reload({ transaction })
    assertAppointmentOpen(appointment, clock.now)
  })
  await appointment.reload()
  return shapeAppointment(appointment, access.patient.userId, clock.settings.timeZone)
})
