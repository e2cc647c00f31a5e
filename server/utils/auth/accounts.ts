import type { H3Event } from 'h3'
import { createError } from 'h3'
import { Patient, User } from '../../db/models'

/**
 * An admin switches an account off or on again (issue 11). Switching off ends every session
 * of the account at once (its next request answers 401) and sign-in then fails with the same
 * message as a wrong password; an admin cannot switch off his own account. The change is a
 * conditional update, so of two admins doing the same at once the second gets 409.
 */
export async function setAccountActive(event: H3Event, active: boolean) {
  const admin = await requireRole(event, ['admin'])
  const userId = idParam(event)
  if (!active && userId === admin.id) throw createError({ statusCode: 400, message: 'errors.notYourOwnAccount' })

  const sequelize = await useDb()
  return sequelize.transaction(async (transaction) => {
    const user = userId ? await User.findByPk(userId, { include: [{ model: Patient, as: 'patient' }], transaction }) : null
    if (!user) throw createError({ statusCode: 404, message: 'errors.notFound' })
    const [changed] = await User.update({ active }, { where: { id: user.id, active: !active }, transaction })
    if (!changed) throw createError({ statusCode: 409, message: active ? 'errors.accountAlreadyActive' : 'errors.accountAlreadyInactive' })
    const ended = active ? 0 : await endSessions(user.id, 'deactivated', { transaction })
    const patientId = user.patient?.id ?? null
    await recordAudit(event, { actor: admin, patientId, action: active ? 'user.reactivate' : 'user.deactivate', resource: `user:${user.id}` }, transaction)
    return { id: user.id, active, sessionsEnded: ended }
  })
}
