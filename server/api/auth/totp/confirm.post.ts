import { totpConfirmSchema } from '#shared/auth/totp'
import { User } from '../../../db/models'

/**
 * Confirms enrolment with a code from the app: the pending secret becomes his second
 * factor, ten recovery codes are made and returned (this once only). A half-signed-in user
 * is then signed in.
 */
export default defineEventHandler(async (event) => {
  setResponseHeader(event, 'Cache-Control', 'no-store')
  const { user, pending } = await requireEnrollingUser(event)
  if (user.totpEnabledAt && user.totpSecret) throw createError({ statusCode: 409, message: 'errors.secondFactorAlreadyOn' })
  const { code } = await readValidatedBody(event, parseWith(totpConfirmSchema))
  const sequelize = await useDb()
  const recoveryCodes = await sequelize.transaction(async (transaction) => {
    const fresh = await User.findByPk(user.id, { transaction })
    if (!fresh?.totpPendingSecret) throw createError({ statusCode: 409, message: 'errors.secondFactorNotStarted' })
    if (!await checkCode(event, user.id, { code, pending: true }, transaction)) return null
    await User.update({ totpSecret: fresh.totpPendingSecret, totpPendingSecret: null, totpEnabledAt: new Date() }, { where: { id: user.id }, transaction })
    await recordAudit(event, { actor: user, patientId: null, action: 'auth.secondFactor.enrol', resource: `${event.method} ${event.path}` }, transaction)
    return newRecoveryCodes(user.id, transaction)
  })
  // A wrong code is counted (committed above) before it is refused.
  if (!recoveryCodes) throw wrongCode()
  const sessionUser = pending ? await completeSignIn(event, user) : sessionUserOf(user)
  return { user: sessionUser, recoveryCodes }
})
