import { Op } from 'sequelize'
import { scheduleStatus } from '../../shared/clinical/schedule'
import { dueGroup } from '../../shared/scheduling/planning'
import { OPEN_APPOINTMENT_STATUSES } from '../../shared/scheduling/types'
import type { DueListRow } from '../../shared/types/schedule'
import { Appointment, Injection, Patient, PatientRegimen, Regimen, User } from '../db/models'

/**
 * The due list (staff): every active patient who is overdue, late, due this week, due in
 * the next two weeks or not started yet, with his next appointment. Four queries for the
 * whole clinic; the page groups, sorts and searches.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireRole(event, ['nurse', 'clinician', 'admin'])
  const clock = await scheduleClock()
  const tz = clock.settings.timeZone
  const [patients, plans, injections, appointments] = await Promise.all([
    Patient.findAll({ include: [{ model: User, as: 'user', attributes: ['name', 'active'], where: { active: true } }] }),
    PatientRegimen.findAll({ where: { endsOn: { [Op.is]: null } }, include: [{ model: Regimen, as: 'regimen' }], order: [['startsOn', 'ASC'], ['id', 'ASC']] }),
    Injection.findAll({ attributes: ['patientId', 'givenOn', 'givenAt', 'regimenId'], order: [['givenAt', 'ASC'], ['id', 'ASC']] }),
    Appointment.findAll({
      where: { status: { [Op.in]: [...OPEN_APPOINTMENT_STATUSES] }, startsAt: { [Op.gte]: startOfClinicDay(clock.today, tz) } },
      attributes: ['id', 'patientId', 'startsAt', 'status'],
      order: [['startsAt', 'DESC'], ['id', 'DESC']],
    }),
  ])
  const intervals = new Map((await Regimen.findAll({ attributes: ['id', 'intervalDays'] })).map(r => [r.id, r.intervalDays]))
  // Later rows overwrite earlier ones: the current plan, the last injection, the next appointment.
  const planOf = new Map(plans.map(p => [p.patientId, p]))
  const lastOf = new Map(injections.map(i => [i.patientId, i]))
  const nextOf = new Map(appointments.map(a => [a.patientId, a]))

  const rows: DueListRow[] = []
  let later = 0
  for (const patient of patients) {
    const plan = planOf.get(patient.id)
    const last = lastOf.get(patient.id)
    const status = scheduleStatus({
      lastInjectionDate: last?.givenOn ?? null,
      intervalDays: (last && intervals.get(last.regimenId)) || plan?.regimen?.intervalDays || 28,
      today: clock.today,
      earlyDays: clock.settings.windowEarlyDays,
      lateDays: clock.settings.windowLateDays,
    })
    const group = dueGroup(status)
    if (!group) {
      later++
      continue
    }
    const next = nextOf.get(patient.id)
    rows.push({
      patientId: patient.id,
      name: patient.user?.name ?? '',
      clinicNumber: patient.clinicNumber,
      regimenName: plan?.regimen?.name ?? null,
      lastInjectionOn: last?.givenOn ?? null,
      ...status,
      group,
      nextAppointment: next ? { id: next.id, startsAt: next.startsAt.toISOString(), status: next.status } : null,
    })
  }
  await recordAudit(event, { actor, patientId: null, action: 'due-list.read', resource: event.path })
  return { today: clock.today, timeZone: tz, rows, later }
})
