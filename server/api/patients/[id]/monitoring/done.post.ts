import { doneAfter } from '#shared/monitoring/rules'
import { markDoneSchema } from '#shared/monitoring/schemas'
import { MonitoringItem } from '../../../../db/models'

/**
 * Nurses and clinicians: a check of his plan was done on a day (an ECG, a bone scan, a
 * blood pressure, or a result kept outside Tidewell). Its next due date follows from it.
 */
export default defineEventHandler(async (event) => {
  const access = await authorizePatient(event, idParam(event), 'labs.record')
  const clock = await scheduleClock()
  const input = await readValidatedBody(event, parseWith(markDoneSchema(clock.today)))
  const sequelize = await useDb()
  return sequelize.transaction(async (transaction) => {
    const item = await MonitoringItem.findOne({ where: { patientId: access.patient.id, kind: input.kind }, transaction })
    if (!item) throw fieldError('kind', 'validation.monitoring.notInPlan')
    await item.update({ lastDoneOn: doneAfter(item.lastDoneOn, input.doneOn), ...(input.note ? { note: input.note } : {}) }, { transaction })
    return monitoringPlanView(access, clock, transaction)
  })
})
