import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'
import { CaughtMail } from '../db/models'

/**
 * With no SMTP_URL, a local mail catcher listens on loopback and keeps every message it
 * receives in the database, so the demo's e-mails can be read on the admin "Mail catcher"
 * page. Nothing leaves the machine. It holds every reset and invitation link, so it runs
 * only in development, in the demo (NUXT_SEED_DEMO) or when NUXT_MAIL_CATCHER=true.
 */
export default defineNitroPlugin((nitroApp) => {
  const config = useRuntimeConfig()
  if (!mailCatcherEnabled()) return
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then(async (mail) => {
          await useDb()
          const to = [mail.to].flat().filter(Boolean).map(a => (a as { text: string }).text).join(', ')
          await CaughtMail.create({ from: mail.from?.text ?? '', to, subject: mail.subject ?? '', text: mail.text ?? '' })
          callback()
        })
        .catch(error => callback(error as Error))
    },
  })
  server.on('error', error => console.error('[tidewell] mail catcher', error.message))
  server.listen(Number(config.mailCatcherPort), '127.0.0.1')
  nitroApp.hooks.hook('close', () => new Promise<void>(done => server.close(() => done())))
})
