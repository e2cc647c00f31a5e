import { Op } from 'sequelize'
import { readKitLabel } from '#shared/visit/gs1'
import { visitKitSchema } from '#shared/visit/schemas'
import { Regimen, VisitKit } from '../../../../../db/models'

/**
 * A kit prepared: its label read from the carton's GS1 barcode or typed, the regimen it is,
 * and the inspection (powder without clumping or caking, diluent clear and colourless).
 * Refused: an unreadable label, an expired kit, a formulation that is not his regimen, and a
 * second kit while one is still prepared or mixed (one kit is one dose: two kits for one dose
 * are forbidden). A kit that fails inspection is recorded as wasted (kit defect).
 */
export default defineEventHandler(async (event) => {
  const { patient, user } = await authorizePatient(event, idParam(event), 'injection.record')
  const input = await readValidatedBody(event, parseWith(visitKitSchema))
  let label = { gtin: null as string | null, lot: input.lotNumber ?? '', expiresOn: input.lotExpiresOn ?? '' }
  if (input.barcode) {
    const reading = readKitLabel(input.barcode)
    if (!reading.ok) throw fieldError('barcode', `validation.visit.label.${reading.error}`)
    label = { gtin: reading.label.gtin, lot: reading.label.lot, expiresOn: reading.label.expiresOn }
  }
  const clock = await scheduleClock()
  const sequelize = await useDb()
  const visit = await sequelize.transaction(async (transaction) => {
    const visit = await findVisit(event, patient, transaction)
    requireChecked(visit)
    if (kitExpired(label.expiresOn, clock.today)) throw fieldError(input.barcode ? 'barcode' : 'lotExpiresOn', 'validation.visit.kitExpired')
    const regimen = await Regimen.findOne({ where: { id: input.regimenId, active: true }, transaction })
    if (!regimen) throw fieldError('regimenId', 'validation.visit.regimenRequired')
    const plan = await currentRegimenOf(patient.id, transaction)
    if (plan && plan.regimenId !== regimen.id) throw fieldError('regimenId', 'validation.visit.regimenMismatch')
    const inUse = await VisitKit.count({ where: { visitId: visit.id, status: { [Op.in]: ['prepared', 'mixed'] } }, transaction })
    if (inUse) throw createError({ statusCode: 409, message: 'errors.visit.oneKit' })
    const inspected = input.powderOk && input.diluentOk
    await VisitKit.create({
      visitId: visit.id,
      patientId: patient.id,
      regimenId: regimen.id,
      gtin: label.gtin,
      lotNumber: label.lot.toUpperCase(),
      lotExpiresOn: label.expiresOn,
      powderOk: input.powderOk,
      diluentOk: input.diluentOk,
      inspectedByUserId: user.id,
      ...(inspected ? {} : { status: 'wasted' as const, wasteReason: 'kit-defect' as const, wastedAt: clock.now }),
    }, { transaction })
    return visit
  })
  setResponseStatus(event, 201)
  return visitView(visit, patient, clock)
})
