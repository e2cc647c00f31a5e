import { monitoringPlanSchema } from '#shared/monitoring/schemas'
import { MonitoringPlan } from '../../../../db/models'

/**
 * Clinicians: set his whole plan (its owner and every item). Items keep the date they were
 * last done; a kind left out is removed. A plan set here before one was made from the
 * defaults is made now, for his current regimen.
 */
export default defineEventHandler(async (event) => {
  const access = await authorizePatient(event, idParam(event), 'monitoring.manage')
  const input = await readValidatedBody(event, parseWith(monitoringPlanSchema))
  const clock = await scheduleClock()
  const sequelize = await useDb()
  return sequelize.transaction(async (transaction) => {
    await requireClinicianOwner(input.ownerUserId, transaction)
    const regimen = await monitoringRegimenOf(access.patient.id, transaction)
    const [plan] = await MonitoringPlan.findOrCreate({
      where: { patientId: access.patient.id },
      defaults: { patientId: access.patient.id, ownerUserId: input.ownerUserId, regimenId: regimen?.regimenId ?? null },
      transaction,
    })
    plan.ownerUserId = input.ownerUserId
    await saveMonitoringItems(plan, input.items, transaction, { replace: true })
    return monitoringPlanView(access, clock, transaction)
  })
})
