import { Op } from 'sequelize'
import { cancelAppointmentSchema } from '#shared/schedule/schemas'
import { OPEN_APPOINTMENT_STATUSES } from '#shared/schedule/statuses'
import { Appointment, AppointmentChangeRequest, User } from '../../../db/models'

/**
 * Staff cancel an open appointment with a reason (kept on the appointment with who and when;
 * shown to the patient in the app, not in the e-mail). A conditional update: of two at once,
 * one cancels and the other gets 409. His open request is answered ('cancel'), and he gets
 * an e-mail in his language saying the appointment was cancelled, with no reason or health
 * detail in it.
 */
export default defineEventHandler(async (event) => {
  const { access, appointment } = await authorizeAppointment(event, 'appointment.schedule')
  const input = await readValidatedBody(event, parseWith(cancelAppointmentSchema))
  const clock = await scheduleClock()
  const sequelize = await useDb()
  await sequelize.transaction(async (transaction) => {
    const [cancelled] = await Appointment.update({ status: 'cancelled', cancelReason: input.reason, cancelledAt: clock.now, cancelledByUserId: access.user.id }, {
      where: { id: appointment.id, patientId: access.patient.id, status: { [Op.in]: [...OPEN_APPOINTMENT_STATUSES] } },
      transaction,
    })
    if (!cancelled) throw createError({ statusCode: 409, message: 'errors.schedule.appointmentClosed' })
    await AppointmentChangeRequest.update({ status: 'answered', decision: 'cancel', answerNote: input.reason, answeredByUserId: access.user.id, answeredAt: clock.now }, {
      where: { appointmentId: appointment.id, patientId: access.patient.id, status: 'open' },
      transaction,
    })
    const patientUser = await User.findByPk(access.patient.userId, { transaction })
    if (patientUser?.active) {
      await enqueueMail({
        ...mailTo(patientUser),
        template: 'appointmentCancelled',
        params: { name: patientUser.name, when: formatAppointmentTime(appointment.startsAt, patientUser.language, clock.settings.timeZone) },
        linkPath: '/today',
        dedupeKey: `appointment-cancelled:${appointment.id}`,
      }, transaction)
    }
  })
  await appointment.reload()
  return shapeAppointment(appointment, access.patient.userId, clock.settings.timeZone)
})
