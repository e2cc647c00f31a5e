import { forgotPasswordSchema } from '#shared/auth/schemas'

/**
 * Always the same answer, at once, whether or not the e-mail belongs to an account: the
 * route only counts the request (per client address: 429 past the limit; per e-mail
 * address: past it, no e-mail, the same answer) and queues it. Looking the address up
 * and writing the e-mail happen afterwards (server/utils/auth/reset-requests.ts).
 */
export default defineEventHandler(async (event) => {
  const { email } = await readValidatedBody(event, parseWith(forgotPasswordSchema))
  const sequelize = await useDb()
  const ip = clientIp(event)
  await sequelize.transaction(async (transaction) => {
    await throttle(event, [{ scope: 'forgot:ip', key: `ip:${ip}`, ...LIMITS.forgotPerIp }], transaction)
    const maySend = await takeHits([{ scope: 'forgot:address', key: addressKey(email), ...LIMITS.forgotPerAddress }], transaction) === 0
    await sequelize.query(
      'INSERT INTO reset_requests (email, may_send, requested_at) VALUES (:email, :maySend, :now)',
      { replacements: { email, maySend, now: new Date() }, transaction },
    )
  })
  processResetRequests().catch(error => console.error('[tidewell] reset requests', error))
  setResponseStatus(event, 202)
  return { ok: true }
})
