import { hashToken } from './tokens'
import { parseDbDate, secondsUntil } from './throttle'

/*
 * Sign-in throttling (DEVELOPERS.md "Throttling"). Every failure is a row in
 * sign_in_failures with the account (hashed normalised e-mail, whether or not it exists)
 * and the client address (hashed, migration 0011). Three rules, over the last hour:
 *
 * - one address guessing one account (the pair): 5 failures free, then each try waits
 *   30 s after the last failure, doubling, at most 15 minutes;
 * - one account from every address: 10 failures free, then 1 s doubling, at most 60 s.
 *   This slows guessing spread over many addresses, and is the only rule an outsider can
 *   make a nurse feel: a wait of a minute at most, never a lock;
 * - one address across every account: a hard limit of 50 failures, then 429 until the
 *   oldest of them is an hour old.
 *
 * A right password clears the pair's failures (this address and this account) only.
 */
export const WINDOW_MS = 60 * 60 * 1000
export const PAIR = { free: 5, baseS: 30, capS: 15 * 60 }
export const ACCOUNT = { free: 10, baseS: 1, capS: 60 }
export const IP_MAX_FAILURES = 50

/** Failures are counted per account (the normalised e-mail), whether or not it exists. */
export function accountKey(email: string): string {
  return hashToken(`sign-in:${email.trim().toLowerCase()}`)
}

/** Seconds to wait after the last of `count` failures before the next try (0 = none). */
export function progressiveDelayS(count: number, rule: { free: number, baseS: number, capS: number }): number {
  if (count < rule.free) return 0
  return Math.min(rule.baseS * 2 ** Math.min(count - rule.free, 20), rule.capS)
}

interface Tally { n: number, last: string | null }

/**
 * Counts one sign-in attempt as a failure before the password is checked, unless a rule
 * says wait: returns 0 when counted, else the seconds to wait (nothing is counted). The
 * reads and the INSERT run in one IMMEDIATE transaction in the write line, so parallel
 * guesses cannot all read "room left" and all count: of 20 at once, 5 count. A right
 * password then clears the pair's failures (clearFailures); a wrong one leaves this one
 * counted.
 */
export async function takeAttempt(key: string, ip: string, now = new Date()): Promise<number> {
  const sequelize = await useDb()
  const since = new Date(now.getTime() - WINDOW_MS)
  return sequelize.transaction(async (transaction) => {
    const tally = async (where: string) => {
      const [[row]] = await sequelize.query(
        `SELECT COUNT(*) AS n, MAX(at) AS last FROM sign_in_failures WHERE ${where} AND at > :since`,
        { replacements: { key, ip, since }, transaction },
      ) as [Tally[], unknown]
      return row ?? { n: 0, last: null }
    }
    const waitAfter = (t: Tally, rule: typeof PAIR) => {
      const delay = progressiveDelayS(Number(t.n), rule)
      return delay && t.last ? Math.max(0, Math.ceil((parseDbDate(t.last).getTime() + delay * 1000 - now.getTime()) / 1000)) : 0
    }
    let wait = Math.max(
      waitAfter(await tally('account_key = :key AND ip_key = :ip'), PAIR),
      waitAfter(await tally('account_key = :key'), ACCOUNT),
    )
    const [ipRows] = await sequelize.query(
      `SELECT at FROM sign_in_failures WHERE ip_key = :ip AND at > :since ORDER BY at DESC LIMIT 1 OFFSET :offset`,
      { replacements: { ip, since, offset: IP_MAX_FAILURES - 1 }, transaction },
    ) as [{ at: string }[], unknown]
    if (ipRows[0]) wait = Math.max(wait, secondsUntil(parseDbDate(ipRows[0].at), WINDOW_MS, now))
    if (wait) return wait
    await sequelize.query(
      'INSERT INTO sign_in_failures (account_key, ip_key, at) VALUES (:key, :ip, :now)',
      { replacements: { key, ip, now }, transaction },
    )
    await sequelize.query('DELETE FROM sign_in_failures WHERE at <= :since', { replacements: { since }, transaction })
    return 0
  })
}

/** After a right password: forgets this address's failures for this account. */
export async function clearFailures(key: string, ip: string) {
  const sequelize = await useDb()
  await sequelize.query('DELETE FROM sign_in_failures WHERE account_key = :key AND ip_key = :ip', { replacements: { key, ip } })
}
