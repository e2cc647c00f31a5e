import { mixGapMinutes } from '#shared/visit/rules'
import { giveDoseSchema } from '#shared/visit/schemas'
import { Regimen, VisitKit } from '../../../../../db/models'

/**
 * The dose given from one mixed kit: the whole dose (a part of one is refused), aspiration
 * checked, sharps disposed of, at a site. Past the clinic's limit from mixing, it answers 409
 * with the minutes (`data.mixGapMinutes`) until the nurse confirms (`lateMixAcknowledged`).
 * Records the injection as the injection form does (recordInjection): the regimen and the
 * appointments it fulfils follow.
 */
export default defineEventHandler(async (event) => {
  const { patient, user } = await authorizePatient(event, idParam(event), 'injection.record')
  const input = await readValidatedBody(event, parseWith(giveDoseSchema))
  const clock = await scheduleClock()
  const sequelize = await useDb()
  const visit = await sequelize.transaction(async (transaction) => {
    const visit = await findVisit(event, patient, transaction)
    requireChecked(visit)
    const kit = await VisitKit.findOne({ where: { id: input.kitId, visitId: visit.id }, include: [{ model: Regimen, as: 'regimen' }], transaction })
    if (!kit) throw fieldError('kitId', 'validation.visit.kit')
    if (kit.status !== 'mixed' || !kit.mixedAt) throw createError({ statusCode: 409, message: 'errors.visit.notMixed' })
    const givenAt = visitInstant(visit, input.givenAt, clock)
    if (givenAt.getTime() > clock.now.getTime() + 5 * 60_000) throw fieldError('givenAt', 'validation.visit.futureTime')
    if (givenAt < kit.mixedAt) throw fieldError('givenAt', 'validation.visit.beforeMixing')
    const gap = mixGapMinutes(kit.mixedAt, givenAt)
    if (gap > clock.settings.mixToInjectMinutes && !input.lateMixAcknowledged) {
      throw createError({ statusCode: 409, message: 'errors.visit.mixGap', data: { mixGapMinutes: gap, limitMinutes: clock.settings.mixToInjectMinutes } })
    }
    const injection = await recordInjection({
      patient,
      user,
      regimen: kit.regimen!,
      givenAt,
      givenOn: visit.visitDate,
      site: input.site,
      lotNumber: kit.lotNumber,
      lotExpiresOn: kit.lotExpiresOn,
      note: null,
    }, clock, transaction)
    await kit.update({ status: 'given' }, { transaction })
    return visit.update({
      status: 'given',
      injectionId: injection.id,
      mixGapMinutes: gap,
      lateMixAcknowledged: gap > clock.settings.mixToInjectMinutes,
      closedAt: clock.now,
      closedByUserId: user.id,
    }, { transaction })
  })
  return visitView(visit, patient, clock)
})
