import { Op } from 'sequelize'
import { OPEN_APPOINTMENT_STATUSES } from '#shared/schedule/statuses'
import { openVisitSchema } from '#shared/visit/schemas'
import { Appointment, Visit } from '../../../../db/models'

/**
 * He is here: opens today's visit, for one of his open appointments today or as a walk-in
 * (nurses and clinicians). A visit already open for him today is answered again (200), so
 * two nurses or a double click open one visit.
 */
export default defineEventHandler(async (event) => {
  const { patient, user } = await authorizePatient(event, idParam(event), 'injection.record')
  const input = await readValidatedBody(event, parseWith(openVisitSchema))
  const clock = await scheduleClock()
  const sequelize = await useDb()
  const { visit, created } = await sequelize.transaction(async (transaction) => {
    const open = await Visit.findOne({ where: { patientId: patient.id, visitDate: clock.today, status: 'here' }, transaction })
    if (open) return { visit: open, created: false }
    if (input.appointmentId !== null) {
      const appointment = await Appointment.findOne({
        where: { id: input.appointmentId, patientId: patient.id, status: { [Op.in]: [...OPEN_APPOINTMENT_STATUSES] } },
        transaction,
      })
      if (!appointment) throw fieldError('appointmentId', 'validation.visit.appointment')
    }
    const visit = await Visit.create({ patientId: patient.id, appointmentId: input.appointmentId, visitDate: clock.today, openedByUserId: user.id }, { transaction })
    return { visit, created: true }
  })
  setResponseStatus(event, created ? 201 : 200)
  return visitView(visit, patient, clock)
})
