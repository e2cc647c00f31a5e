import { planFromDefaults } from '#shared/monitoring/rules'
import { applyDefaultsSchema } from '#shared/monitoring/schemas'
import { riskProfileOf, RISK_FACTORS } from '#shared/triage/risk-profile'
import { MonitoringItem, MonitoringPlan } from '../../../../db/models'

/**
 * Clinicians: make his plan from the clinic defaults of his current regimen (201), or apply
 * them again after a regimen change (200): intervals and first-due dates follow the
 * regimen; each item keeps the date it was last done, its note and whether it is active.
 */
export default defineEventHandler(async (event) => {
  const access = await authorizePatient(event, idParam(event), 'monitoring.manage')
  const input = await readValidatedBody(event, parseWith(applyDefaultsSchema))
  const clock = await scheduleClock()
  const sequelize = await useDb()
  const { created, view } = await sequelize.transaction(async (transaction) => {
    await requireClinicianOwner(input.ownerUserId, transaction)
    const regimen = await monitoringRegimenOf(access.patient.id, transaction)
    if (!regimen) throw createError({ statusCode: 409, message: 'errors.monitoringNoRegimen' })
    const profile = riskProfileOf(access.patient.riskProfile)
    const risks = RISK_FACTORS.filter(factor => profile[factor])
    const [plan, created] = await MonitoringPlan.findOrCreate({
      where: { patientId: access.patient.id },
      defaults: { patientId: access.patient.id, ownerUserId: input.ownerUserId, regimenId: regimen.regimenId },
      transaction,
    })
    const existing = await MonitoringItem.findAll({ where: { planId: plan.id }, transaction })
    plan.ownerUserId = input.ownerUserId
    plan.regimenId = regimen.regimenId
    await saveMonitoringItems(plan, planFromDefaults(regimen.start, clock.today, risks, planItemsOf(existing)), transaction, { replace: false })
    return { created, view: await monitoringPlanView(access, clock, transaction) }
  })
  setResponseStatus(event, created ? 201 : 200)
  return view
})
