import type { MonitoringDueListView, MonitoringDueRow } from '#shared/monitoring/views'
import { MonitoringItem, Patient, User } from '../../db/models'

/**
 * Monitoring due (nurses and clinicians): every active check of every active patient that
 * is overdue or due by the end of this month, beside the due list. The page groups by state
 * and by check. One audit line per patient shown.
 */
export default defineEventHandler(async (event): Promise<MonitoringDueListView> => {
  const actor = await requireRole(event, ['nurse', 'clinician'])
  const clock = await scheduleClock()
  const [items, psa] = await Promise.all([
    MonitoringItem.findAll({
      where: { active: true },
      include: [{ model: Patient, as: 'patient', attributes: ['id', 'clinicNumber'], include: [{ model: User, as: 'user', attributes: ['name'], where: { active: true } }] }],
    }),
    psaResultsOf(null),
  ])
  const rises = psaRiseDates(psa)
  const rows: MonitoringDueRow[] = []
  for (const item of items) {
    const { dueOn, state } = dueOf(item, clock.today, rises.get(item.patientId) ?? null)
    if (!dueOn || !state || state === 'later') continue
    rows.push({
      itemId: item.id,
      patientId: item.patientId,
      name: item.patient?.user?.name ?? '',
      clinicNumber: item.patient?.clinicNumber ?? '',
      kind: item.kind,
      dueOn,
      state,
      lastDoneOn: item.lastDoneOn,
    })
  }
  rows.sort((a, b) => a.dueOn.localeCompare(b.dueOn) || a.name.localeCompare(b.name))
  await recordListAudit(event, { actor, action: 'monitoring-due.read', resource: `${event.method} ${event.path}` }, [...new Set(rows.map(row => row.patientId))])
  return { today: clock.today, rows }
})
