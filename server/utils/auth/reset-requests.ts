import { User } from '../../db/models'
import { parseDbDate } from './throttle'

/*
 * Forgot-password requests are queued (table reset_requests) and worked off here, after
 * the answer has gone: the route does the same writes for any address, so neither its
 * answer nor its time tells whether the address has an account. A row is removed in the
 * transaction that writes its e-mail, so a restart loses none and sends none twice.
 */
let running: Promise<number> | undefined

export function processResetRequests(): Promise<number> {
  running ??= (async () => {
    const sequelize = await useDb()
    let done = 0
    for (;;) {
      const [rows] = await sequelize.query('SELECT id, email, may_send AS "maySend", requested_at AS "requestedAt" FROM reset_requests ORDER BY id LIMIT 20') as [{ id: number, email: string, maySend: number | boolean, requestedAt: string | Date }[], unknown]
      if (!rows.length) return done
      for (const row of rows) {
        await sequelize.transaction(async (transaction) => {
          await sequelize.query('DELETE FROM reset_requests WHERE id = :id', { replacements: { id: row.id }, transaction })
          if (!row.maySend) return
          const user = await User.findOne({ where: { email: row.email, active: true }, transaction })
          if (!user) return
          const token = await issueToken({ userId: user.id, purpose: 'reset' }, transaction, parseDbDate(row.requestedAt))
          await enqueueMail({
            ...mailTo(user),
            template: 'reset',
            params: { name: user.name },
            linkPath: `/set-password?token=${token}`,
          }, transaction)
        })
        done++
      }
    }
  })().finally(() => {
    running = undefined
  })
  return running
}
