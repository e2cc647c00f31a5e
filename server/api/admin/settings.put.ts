import { clinicSettingsSchema } from '#shared/settings/schemas'
import { ClinicSetting } from '../../db/models'

/** Saves every clinic setting at once (admins); the change is in the audit trail. */
export default defineEventHandler(async (event) => {
  const actor = await requireRole(event, ['admin'])
  const input = await readValidatedBody(event, parseWith(clinicSettingsSchema))
  const sequelize = await useDb()
  const before = await getSettings()
  await sequelize.transaction(async (transaction) => {
    for (const [key, value] of Object.entries(input)) {
      await ClinicSetting.upsert({ key, value }, { transaction })
    }
    const changed = Object.keys(input).filter(key => JSON.stringify(input[key as keyof typeof input]) !== JSON.stringify(before[key as keyof typeof before]))
    await recordAudit(event, { actor, patientId: null, action: 'settings.update', resource: `settings:${changed.join(',') || 'none'}` }, transaction)
  })
  return getSettings()
})
