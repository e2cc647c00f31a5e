import type { TotpEnrolment } from '#shared/auth/totp'
import { User } from '../../../db/models'

/**
 * Starts (or shows again) enrolment: a new secret, kept encrypted as pending until a code
 * confirms it, with its QR code. For a half-signed-in user whose role needs a second
 * factor, or a signed-in user without one (a patient or caregiver turning it on).
 */
export default defineEventHandler(async (event): Promise<TotpEnrolment> => {
  setResponseHeader(event, 'Cache-Control', 'no-store')
  const { user } = await requireEnrollingUser(event)
  if (user.totpEnabledAt && user.totpSecret) throw createError({ statusCode: 409, message: 'errors.secondFactorAlreadyOn' })
  const sequelize = await useDb()
  const secret = await sequelize.transaction(async (transaction) => {
    const fresh = await User.findByPk(user.id, { transaction })
    if (fresh?.totpPendingSecret) return decryptSecret(fresh.totpPendingSecret)
    const made = newTotpSecret()
    await User.update({ totpPendingSecret: encryptSecret(made) }, { where: { id: user.id }, transaction })
    return made
  })
  return enrolmentView(secret, user.email)
})
