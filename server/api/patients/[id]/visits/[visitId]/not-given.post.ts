import { Op } from 'sequelize'
import { notGivenSchema } from '#shared/visit/schemas'
import { VisitKit } from '../../../../../db/models'

/**
 * Not given today, with the reason (blood on aspiration, a kit defect, he declined, he is
 * unwell). A kit still prepared or mixed is recorded as wasted; nothing counts as an
 * injection and the schedule does not move.
 */
export default defineEventHandler(async (event) => {
  const { patient, user } = await authorizePatient(event, idParam(event), 'injection.record')
  const input = await readValidatedBody(event, parseWith(notGivenSchema))
  const clock = await scheduleClock()
  const sequelize = await useDb()
  const visit = await sequelize.transaction(async (transaction) => {
    const visit = await findVisit(event, patient, transaction)
    requireHere(visit)
    await VisitKit.update({ status: 'wasted', wasteReason: input.reason === 'blood-on-aspiration' || input.reason === 'kit-defect' ? input.reason : 'not-given', wastedAt: clock.now }, {
      where: { visitId: visit.id, status: { [Op.in]: ['prepared', 'mixed'] } },
      transaction,
    })
    return visit.update({ status: 'not-given', notGivenReason: input.reason, notGivenNote: input.note ?? null, closedAt: clock.now, closedByUserId: user.id }, { transaction })
  })
  return visitView(visit, patient, clock)
})
