import { Op } from 'sequelize'
import { OutboxMessage } from '../../db/models'

/**
 * The state of the e-mail outbox for admins: how many e-mails wait and since when, how
 * many wait for a retry, the last send error and the next try. Counts, times and the
 * mail server's error only: no addresses, subjects or bodies. The read is audited.
 */
export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, ['admin'])
  const pending = { status: 'pending' }
  const [waiting, retrying, sent, alerts, oldest, next, failed, lastSent] = await Promise.all([
    OutboxMessage.count({ where: { ...pending, attempts: 0 } }),
    OutboxMessage.count({ where: { ...pending, attempts: { [Op.gt]: 0 } } }),
    OutboxMessage.count({ where: { status: 'sent' } }),
    OutboxMessage.count({ where: { ...pending, ...alertWhere } }),
    OutboxMessage.findOne({ where: pending, attributes: ['createdAt'], order: [['createdAt', 'ASC']] }),
    OutboxMessage.findOne({ where: pending, attributes: ['nextAttemptAt'], order: [['nextAttemptAt', 'ASC']] }),
    OutboxMessage.findOne({ where: { ...pending, lastError: { [Op.ne]: null } }, attributes: ['lastError', 'updatedAt'], order: [['updatedAt', 'DESC']] }),
    OutboxMessage.findOne({ where: { status: 'sent' }, attributes: ['sentAt'], order: [['sentAt', 'DESC']] }),
  ])
  // The worker remembers its last failure even once that e-mail went out on a later try.
  const seen = lastSendOutcome()
  const stored = failed?.lastError ? { at: failed.updatedAt, message: failed.lastError } : null
  const remembered = seen.lastFailure ? { at: seen.lastFailure.at, message: seen.lastFailure.error } : null
  const lastError = [stored, remembered].filter(e => e !== null).sort((a, b) => b.at.getTime() - a.at.getTime())[0] ?? null
  await recordAudit(event, { actor: admin, patientId: null, action: 'outbox.read', resource: `${event.method} ${event.path}` })
  const now = Date.now()
  return {
    checkedAt: new Date(now),
    backlog: {
      count: waiting + retrying,
      alerts,
      oldestAt: oldest?.createdAt ?? null,
      oldestMinutes: oldest ? Math.floor((now - oldest.createdAt.getTime()) / 60_000) : null,
    },
    states: { waiting, retrying, sent },
    lastError: lastError ? { at: lastError.at, message: sendErrorText(lastError.message) } : null,
    lastSentAt: lastSent?.sentAt ?? seen.lastSentAt ?? null,
    nextAttemptAt: next?.nextAttemptAt ?? null,
  }
})
