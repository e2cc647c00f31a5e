import { CaughtMail } from '../../db/models'

/**
 * What the local mail catcher received (development, demo or NUXT_MAIL_CATCHER=true;
 * admins). Nothing when the catcher is off. Every read is recorded in the audit trail.
 */
export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, ['admin'])
  const enabled = mailCatcherEnabled()
  const mails = enabled ? await CaughtMail.findAll({ order: [['id', 'DESC']], limit: 100 }) : []
  await recordAudit(event, { actor: admin, patientId: null, action: 'mail-catcher.read', resource: `${event.method} ${event.path}` })
  return { enabled, messages: mails.map(m => ({ id: m.id, from: m.from, to: m.to, subject: m.subject, text: m.text, receivedAt: m.receivedAt })) }
})
