import { dueGroup } from '#shared/schedule/planning'
import type { DueListRow } from '#shared/schedule/views'
import { Patient, User } from '../db/models'

/**
 * The due list (staff): every active patient who is overdue, late, due this week, due in
 * the next two weeks or not started yet, with his next appointment. The same standing as
 * his schedule page (computeSchedules), in a fixed number of queries for the whole
 * clinic; the page groups, sorts and searches.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireRole(event, ['nurse', 'clinician', 'admin'])
  const clock = await scheduleClock()
  const tz = clock.settings.timeZone
  const patients = await Patient.findAll({ include: [{ model: User, as: 'user', attributes: ['name', 'active'], where: { active: true } }] })
  const [standings, nextOf] = await Promise.all([
    computeSchedules(patients.map(p => p.id), clock),
    nextAppointmentsOf(clock),
  ])

  const rows: DueListRow[] = []
  let later = 0
  for (const patient of patients) {
    const standing = standings.get(patient.id)!
    const group = dueGroup(standing)
    if (!group) {
      later++
      continue
    }
    const next = nextOf.get(patient.id)
    rows.push({
      patientId: patient.id,
      name: patient.user?.name ?? '',
      clinicNumber: patient.clinicNumber,
      regimenName: standing.regimen?.name ?? null,
      lastInjectionOn: standing.lastInjection?.date ?? null,
      state: standing.state,
      dueDate: standing.dueDate,
      windowOpens: standing.windowOpens,
      windowCloses: standing.windowCloses,
      daysToDue: standing.daysToDue,
      group,
      nextAppointment: next ? { id: next.id, startsAt: next.startsAt.toISOString(), status: next.status } : null,
    })
  }
  // One line per patient on the list (not those counted as later): audit.ts recordListAudit.
  await recordListAudit(event, { actor, action: 'due-list.read', resource: `${event.method} ${event.path}` }, rows.map(r => r.patientId))
  return { today: clock.today, timeZone: tz, rows, later }
})
