import { Op } from 'sequelize'
import { addDays } from '#shared/schedule/rules'
import { listStateOf } from '#shared/visit/rules'
import type { VisitListRow } from '#shared/visit/views'
import { Appointment, Patient, User, Visit } from '../../db/models'

/**
 * Today's injection list (nurses and clinicians): the appointments of the clinic's day, in
 * time order, each with its state (expected, here, given, not given), then the walk-ins.
 * Cancelled appointments are left out. Two queries, one audit line per patient listed.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireRole(event, ['nurse', 'clinician'])
  const clock = await scheduleClock()
  const tz = clock.settings.timeZone
  const dayStart = startOfClinicDay(clock.today, tz)
  const dayEnd = startOfClinicDay(addDays(clock.today, 1), tz)
  const patientInclude = { model: Patient, as: 'patient', include: [{ model: User, as: 'user', attributes: ['name'] }] }
  const [appointments, visits] = await Promise.all([
    Appointment.findAll({
      where: { startsAt: { [Op.gte]: dayStart, [Op.lt]: dayEnd }, status: { [Op.ne]: 'cancelled' } },
      include: [patientInclude],
      order: [['startsAt', 'ASC'], ['id', 'ASC']],
    }),
    Visit.findAll({ where: { visitDate: clock.today }, include: [patientInclude], order: [['id', 'ASC']] }),
  ])
  // The latest visit for an appointment (a second try after a stopped one) decides its state;
  // a visit opened as a walk-in for a man booked today stands for his appointment.
  const byAppointment = new Map(visits.filter(v => v.appointmentId).map(v => [v.appointmentId!, v]))
  const byPatient = new Map(visits.map(v => [v.patientId, v]))
  const booked = new Set(appointments.map(a => a.patientId))
  const person = (patient: Patient | undefined) => ({ id: patient?.id ?? 0, name: patient?.user?.name ?? '', clinicNumber: patient?.clinicNumber ?? '' })
  const rows: VisitListRow[] = [
    ...appointments.map((appointment) => {
      const visit = byAppointment.get(appointment.id) ?? byPatient.get(appointment.patientId) ?? null
      return {
        patient: person(appointment.patient),
        appointment: { id: appointment.id, startsAt: appointment.startsAt.toISOString(), place: appointment.place },
        visitId: visit?.id ?? null,
        state: listStateOf(visit),
      }
    }),
    ...visits.filter(v => !v.appointmentId && !booked.has(v.patientId)).map(visit => ({ patient: person(visit.patient), appointment: null, visitId: visit.id, state: listStateOf(visit) })),
  ]
  await recordListAudit(event, { actor, action: 'visit-list.read', resource: `${event.method} ${event.path}` }, [...new Set(rows.map(r => r.patient.id))])
  return { today: clock.today, timeZone: tz, rows }
})
