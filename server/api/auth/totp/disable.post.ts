import { totpConfirmSchema } from '#shared/auth/totp'
import { TotpRecoveryCode, User } from '../../../db/models'

/** A patient or caregiver turns his second factor off, with a current code. Staff cannot. */
export default defineEventHandler(async (event) => {
  setResponseHeader(event, 'Cache-Control', 'no-store')
  const signedIn = await requireActiveUser(event)
  if (secondFactorRequired(signedIn.role)) throw createError({ statusCode: 403, message: 'errors.secondFactorRequired' })
  const { code } = await readValidatedBody(event, parseWith(totpConfirmSchema))
  const sequelize = await useDb()
  const ok = await sequelize.transaction(async (transaction) => {
    const user = await User.findByPk(signedIn.id, { transaction })
    if (!user?.totpEnabledAt) throw createError({ statusCode: 409, message: 'errors.secondFactorNotStarted' })
    if (!await checkCode(event, signedIn.id, { code }, transaction)) return false
    await User.update({ totpSecret: null, totpPendingSecret: null, totpEnabledAt: null, totpLastStep: null }, { where: { id: signedIn.id }, transaction })
    await TotpRecoveryCode.destroy({ where: { userId: signedIn.id }, transaction })
    await recordAudit(event, { actor: signedIn, patientId: null, action: 'auth.secondFactor.disable', resource: `${event.method} ${event.path}` }, transaction)
    return true
  })
  if (!ok) throw wrongCode()
  return { enabled: false }
})
