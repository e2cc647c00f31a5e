import { kitDiscardSchema } from '#shared/visit/schemas'

/**
 * A kit thrown away (blood seen on aspiration, a defect found): kept with its lot as wasted,
 * never an injection, and the schedule does not move. The visit stays open for a new kit.
 */
export default defineEventHandler(async (event) => {
  const { patient } = await authorizePatient(event, idParam(event), 'injection.record')
  const input = await readValidatedBody(event, parseWith(kitDiscardSchema))
  const clock = await scheduleClock()
  const sequelize = await useDb()
  const visit = await sequelize.transaction(async (transaction) => {
    const visit = await findVisit(event, patient, transaction)
    requireHere(visit)
    const kit = await findKit(event, visit, transaction)
    if (kit.status !== 'prepared' && kit.status !== 'mixed') throw createError({ statusCode: 409, message: 'errors.visit.kitState' })
    await kit.update({ status: 'wasted', wasteReason: input.reason, wasteNote: input.note ?? null, wastedAt: clock.now }, { transaction })
    return visit
  })
  return visitView(visit, patient, clock)
})
