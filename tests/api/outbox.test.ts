import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { MailCatcher } from '../support/mail-catcher'

let app: RunningApp
let mail: MailCatcher

beforeAll(async () => {
  mail = await MailCatcher.start()
  await mail.stop() // the mail server is down when the e-mail is written
  app = await startApp({ smtpUrl: mail.url })
})
afterAll(async () => {
  await app?.stop()
  await mail?.stop()
})

describe('e-mail outbox', () => {
  it('keeps an e-mail while the SMTP server is down and sends it exactly once when it returns', async () => {
    const reply = await new Client(app.url).post('/api/auth/forgot-password', { email: 'cyril@demo.tidewell.test' })
    expect(reply.status).toBe(202)

    // Several worker passes fail while the server is down (poll and backoff base are 200 ms here).
    await new Promise(r => setTimeout(r, 1500))
    expect(mail.messages).toHaveLength(0)

    await mail.resume()
    const delivered = await mail.waitFor(m => m.to.includes('cyril@demo.tidewell.test'), 20_000)
    expect(delivered.subject).toBe('Choose a new Tidewell password')

    // Give the worker time for more passes: no second copy.
    await new Promise(r => setTimeout(r, 2000))
    expect(mail.messages.filter(m => m.to.includes('cyril@'))).toHaveLength(1)
  })
})
