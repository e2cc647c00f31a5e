import { Op, fn, col, where } from 'sequelize'
import { createRegimenSchema } from '#shared/schedule/schemas'
import { Regimen } from '../../db/models'

/** Adds a regimen of the clinic's own (admins and clinicians). Names are unique, in any case. */
export default defineEventHandler(async (event) => {
  const actor = await requireRole(event, ['admin', 'clinician'])
  const input = await readValidatedBody(event, parseWith(createRegimenSchema))
  const sequelize = await useDb()
  const regimen = await sequelize.transaction(async (transaction) => {
    const clash = await Regimen.findOne({ where: { [Op.and]: [where(fn('lower', col('name')), input.name.toLowerCase())] }, transaction })
    if (clash) throw fieldError('name', 'validation.alreadyExists', 409)
    const created = await Regimen.create({ name: input.name, intervalDays: input.intervalDays }, { transaction })
    await recordAudit(event, { actor, patientId: null, action: 'regimen.create', resource: event.path }, transaction)
    return created
  })
  setResponseStatus(event, 201)
  return { id: regimen.id, name: regimen.name, intervalDays: regimen.intervalDays }
})
