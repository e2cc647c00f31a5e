import { ownPhoneSchema } from '#shared/contact/schemas'
import { User } from '../../db/models'

/**
 * Sets or removes a caregiver's own phone. Patients keep their numbers on their record
 * (PUT /api/patients/:id/contact); staff numbers are the clinic's.
 */
export default defineEventHandler(async (event) => {
  const me = await requireRole(event, ['caregiver'])
  const { phone } = await readValidatedBody(event, parseWith(ownPhoneSchema))
  await User.update({ phone }, { where: { id: me.id } })
  return { phone }
})
