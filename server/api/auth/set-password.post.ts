import { setPasswordSchema } from '#shared/auth/schemas'
import { User } from '../../db/models'

/**
 * Sets a password from an invitation or reset link; the link works exactly once and spends
 * his other outstanding links (tokens.ts). Every other session of his ends (a session from
 * before a reset may be the one that was stolen).
 */
export default defineEventHandler(async (event) => {
  const { token, password } = await readValidatedBody(event, parseWith(setPasswordSchema))
  await throttle(event, [{ scope: 'set-password:ip', key: `ip:${clientIp(event)}`, ...LIMITS.setPasswordPerIp }])
  const problems = await passwordProblemsForLink(token, password)
  if (problems.length) {
    throw fieldError('password', problems, 400, problems[0])
  }
  const sequelize = await useDb()
  const passwordHash = await hashPassword(password)
  const current = await getUserSession(event)
  await sequelize.transaction(async (transaction) => {
    const used = await consumeToken(token, ['invite', 'reset'], transaction)
    const user = used?.userId ? await User.findByPk(used.userId, { transaction }) : null
    if (!user || !user.active) throw createError({ statusCode: 400, message: 'errors.linkInvalid' })
    await user.update({ passwordHash }, { transaction })
    const except = current.user?.id === user.id ? current.secure?.sessionId : null
    await endSessions(user.id, 'password-changed', { except, transaction })
  })
  return { ok: true }
})
