import { User } from '../../db/models'

/** A caregiver's own phone, the number the nurse can call her on. */
export default defineEventHandler(async (event) => {
  const me = await requireRole(event, ['caregiver'])
  const user = await User.findByPk(me.id, { attributes: ['id', 'phone'] })
  return { phone: user?.phone ?? null }
})
