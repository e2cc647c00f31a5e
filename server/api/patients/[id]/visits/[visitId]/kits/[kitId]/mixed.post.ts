import { kitMixedSchema } from '#shared/visit/schemas'

/** The kit mixed, at a clock time on the visit's day: the clock from mixing to injection starts. */
export default defineEventHandler(async (event) => {
  const { patient } = await authorizePatient(event, idParam(event), 'injection.record')
  const input = await readValidatedBody(event, parseWith(kitMixedSchema))
  const clock = await scheduleClock()
  const sequelize = await useDb()
  const visit = await sequelize.transaction(async (transaction) => {
    const visit = await findVisit(event, patient, transaction)
    requireChecked(visit)
    const kit = await findKit(event, visit, transaction)
    if (kit.status !== 'prepared') throw createError({ statusCode: 409, message: 'errors.visit.kitState' })
    const mixedAt = visitInstant(visit, input.mixedAt, clock)
    if (mixedAt.getTime() > clock.now.getTime() + 5 * 60_000) throw fieldError('mixedAt', 'validation.visit.futureTime')
    await kit.update({ status: 'mixed', mixedAt }, { transaction })
    return visit
  })
  return visitView(visit, patient, clock)
})
