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

/**
 * Counts one sign-in attempt as a failure before the password is checked, unless the
 * account already has MAX_FAILURES in the window. It is one conditional INSERT, so
 * parallel guesses cannot all read "fewer than five" and then all count: the sixth finds
 * five and inserts nothing. Returns false when the account is locked. A right password
 * then clears the failures (clearFailures); a wrong one leaves this one counted.
 */
export async function takeAttempt(key: string, now = new Date()): Promise<boolean> {
  const sequelize = await useDb()
  return sequelize.transaction(async (transaction) => {
    await sequelize.query(
      `INSERT INTO sign_in_failures (account_key, at)
       SELECT :key, :now
       WHERE (SELECT COUNT(*) FROM sign_in_failures WHERE account_key = :key AND at > :since) < :max`,
      { replacements: { key, now, since: new Date(now.getTime() - FAILURE_WINDOW_MS), max: MAX_FAILURES }, transaction },
    )
    const [[counted]] = await sequelize.query('SELECT changes() AS n', { transaction }) as [{ n: number }[], unknown]
    await SignInFailure.destroy({ where: { at: { [Op.lt]: new Date(now.getTime() - FAILURE_WINDOW_MS) } }, transaction })
    return counted?.n === 1
  })
}

export async function clearFailures(key: string) {
  await SignInFailure.destroy({ where: { accountKey: key } })
}
