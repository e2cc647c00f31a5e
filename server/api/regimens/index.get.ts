import { Regimen } from '../../db/models'

/** The clinic's regimens (staff). */
export default defineEventHandler(async (event) => {
  await requireRole(event, ['nurse', 'clinician', 'admin'])
  const regimens = await Regimen.findAll({ where: { active: true }, order: [['intervalDays', 'ASC'], ['name', 'ASC']] })
  return regimens.map(r => ({ id: r.id, name: r.name, intervalDays: r.intervalDays }))
})
