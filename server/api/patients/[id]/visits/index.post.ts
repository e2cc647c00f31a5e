import { Op } from 'sequelize'
import { addDays } from '#shared/schedule/rules'
import { OPEN_APPOINTMENT_STATUSES } from '#shared/schedule/statuses'
import { openVisitSchema } from '#shared/visit/schemas'
import { Appointment, Visit } from '../../../../db/models'

/**
 * He is here: opens today's visit, for one of his open appointments or as a walk-in (nurses
 * and clinicians); with no appointment named, the one he has today, if any. A visit already open for him today is answered again (200), so
 * two nurses or a double click open one visit.
 */
export default defineEventHandler(async (event) => {
  const { patient, user } = await authorizePatient(event, idParam(event), 'injection.record')
  const input = await readValidatedBody(event, parseWith(openVisitSchema))
  const clock = await scheduleClock()
  const sequelize = await useDb()
  const { visit, created } = await sequelize.transaction(async (transaction) => {
    const here = await Visit.findOne({ where: { patientId: patient.id, visitDate: clock.today, status: 'here' }, transaction })
    if (here) return { visit: here, created: false }
    const open = { patientId: patient.id, status: { [Op.in]: [...OPEN_APPOINTMENT_STATUSES] } }
    let appointmentId = input.appointmentId
    if (appointmentId !== null) {
      const appointment = await Appointment.findOne({ where: { id: appointmentId, ...open }, transaction })
      if (!appointment) throw fieldError('appointmentId', 'validation.visit.appointment')
    }
    else {
      // Come without naming it, but booked for today: the visit is for that appointment.
      const tz = clock.settings.timeZone
      const todays = await Appointment.findOne({
        where: { ...open, startsAt: { [Op.gte]: startOfClinicDay(clock.today, tz), [Op.lt]: startOfClinicDay(addDays(clock.today, 1), tz) } },
        order: [['startsAt', 'ASC']],
        transaction,
      })
      appointmentId = todays?.id ?? null
    }
    const visit = await Visit.create({ patientId: patient.id, appointmentId, visitDate: clock.today, openedByUserId: user.id }, { transaction })
    return { visit, created: true }
  })
  setResponseStatus(event, created ? 201 : 200)
  return visitView(visit, patient, clock)
})
