import { totpVerifySchema } from '#shared/auth/totp'

/** The second step of signing in: a code from the app, or one recovery code (spent). */
export default defineEventHandler(async (event) => {
  setResponseHeader(event, 'Cache-Control', 'no-store')
  const user = await requirePendingUser(event)
  if (secondFactorStage(user) !== 'verify') throw createError({ statusCode: 409, message: 'errors.secondFactorNotStarted' })
  const body = await readValidatedBody(event, parseWith(totpVerifySchema))
  const sequelize = await useDb()
  const recovery = 'recoveryCode' in body
  const ok = await sequelize.transaction(async (transaction) => {
    const right = await checkCode(event, user.id, recovery ? { recoveryCode: body.recoveryCode } : { code: body.code }, transaction)
    if (right && recovery) await recordAudit(event, { actor: user, patientId: null, action: 'auth.secondFactor.recoveryCode', resource: `${event.method} ${event.path}` }, transaction)
    return right
  })
  if (!ok) throw wrongCode()
  return { user: await completeSignIn(event, user), recoveryCodesLeft: recovery ? await recoveryCodesLeft(user.id) : undefined }
})
