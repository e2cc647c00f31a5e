import { Op } from 'sequelize'
import { SignInFailure } from '../db/models'

export const MAX_FAILURES = 5
export const FAILURE_WINDOW_MS = 15 * 60 * 1000

/** Failures are counted per account (the normalised e-mail), whether or not it exists. */
export function accountKey(email: string): string {
  return hashToken(`sign-in:${email.trim().toLowerCase()}`)
}

/** Seconds until the account may try again, or 0 when it may try now. */
export async function secondsLocked(key: string, now = new Date()): Promise<number> {
  const recent = await SignInFailure.findAll({
    where: { accountKey: key, at: { [Op.gt]: new Date(now.getTime() - FAILURE_WINDOW_MS) } },
    order: [['at', 'DESC']],
    limit: MAX_FAILURES,
  })
  if (recent.length < MAX_FAILURES) return 0
  const oldestCounted = recent[recent.length - 1]!.at.getTime()
  return Math.max(1, Math.ceil((oldestCounted + FAILURE_WINDOW_MS - now.getTime()) / 1000))
}

export async function recordFailure(key: string, now = new Date()) {
  await SignInFailure.create({ accountKey: key, at: now })
  await SignInFailure.destroy({ where: { at: { [Op.lt]: new Date(now.getTime() - FAILURE_WINDOW_MS) } } })
}

export async function clearFailures(key: string) {
  await SignInFailure.destroy({ where: { accountKey: key } })
}
