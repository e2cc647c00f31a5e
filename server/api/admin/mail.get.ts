import { CaughtMail } from '../../db/models'

/** What the local mail catcher received (demo and development only; admins). */
export default defineEventHandler(async (event) => {
  await requireRole(event, ['admin'])
  const mails = await CaughtMail.findAll({ order: [['id', 'DESC']], limit: 100 })
  return { enabled: !useRuntimeConfig().smtpUrl, messages: mails.map(m => ({ id: m.id, from: m.from, to: m.to, subject: m.subject, text: m.text, receivedAt: m.receivedAt })) }
})
