import type { MonitoringDueView } from '#shared/monitoring/views'
import { MonitoringItem } from '../../../../db/models'

/**
 * Anyone who may read his record (he, his caregivers, staff): which planned checks are
 * coming and when, in plain words; no values, intervals or notes.
 */
export default defineEventHandler(async (event): Promise<MonitoringDueView> => {
  const { patient } = await authorizePatient(event, idParam(event), 'patient.read')
  const clock = await scheduleClock()
  const [items, psa] = await Promise.all([
    MonitoringItem.findAll({ where: { patientId: patient.id, active: true } }),
    psaResultsOf([patient.id]),
  ])
  const rise = psaRiseDates(psa).get(patient.id) ?? null
  return {
    today: clock.today,
    items: items.map(item => ({ kind: item.kind, ...dueOf(item, clock.today, rise) }))
      .flatMap(item => (item.dueOn && item.state ? [{ kind: item.kind, dueOn: item.dueOn, state: item.state }] : []))
      .sort((a, b) => a.dueOn.localeCompare(b.dueOn)),
  }
})
