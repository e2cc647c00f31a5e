import { signInSchema } from '#shared/auth/schemas'
import { Patient, User } from '../../db/models'

// A real scrypt hash of a random string, so an unknown e-mail costs the same time as a wrong password.
let decoyHash: Promise<string> | undefined

export default defineEventHandler(async (event) => {
  const body = await readValidatedBody(event, signInSchema.safeParse)
  if (!body.success) throw createError({ statusCode: 401, message: 'errors.signInFailed' })
  const { email, password } = body.data
  await useDb()

  // The attempt counts as a failure until the password proves right (sign-in-limit.ts).
  // Per pair, per account and per address: a growing wait, never a long lock on the account.
  const key = accountKey(email)
  const ip = ipKey(event)
  const wait = await takeAttempt(key, ip)
  if (wait) throw tooManyAttempts(event, wait)

  const user = await User.findOne({ where: { email }, include: [{ model: Patient, as: 'patient' }] })
  decoyHash ??= hashPassword(crypto.randomUUID())
  const valid = await verifyPassword(user?.passwordHash ?? await decoyHash, password)
  if (!user || !user.active || !user.passwordHash || !valid) {
    throw createError({ statusCode: 401, message: 'errors.signInFailed' })
  }

  await clearFailures(key, ip)
  // Staff (and anyone who turned it on) give a code next: a half-signed-in session, no data yet (totp.ts).
  const secondFactor = secondFactorStage(user)
  if (secondFactor) {
    await startSecondFactor(event, user)
    return { user: sessionUserOf(user), secondFactor }
  }
  return { user: await completeSignIn(event, user), secondFactor: null }
})
