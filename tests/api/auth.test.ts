import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client, DEMO_PASSWORD } from '../support/client'
import { linkIn, MailCatcher } from '../support/mail-catcher'

let app: RunningApp
let mail: MailCatcher

beforeAll(async () => {
  mail = await MailCatcher.start()
  app = await startApp({ smtpUrl: mail.url })
})
afterAll(async () => {
  await app?.stop()
  await mail?.stop()
})

describe('sign-in', () => {
  it('signs a demo patient in and the session route shows id, role, name, language and patient id', async () => {
    const client = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const session = await client.get('/api/_auth/session')
    expect(session.status).toBe(200)
    expect(session.body.user).toMatchObject({ role: 'patient', name: 'Elias Marwood', language: 'en' })
    expect(session.body.user.id).toBeGreaterThan(0)
    expect(session.body.user.patientId).toBeGreaterThan(0)
  })

  // Secure only when the public URL is https (this server's is http): tests/api/accounts.test.ts.
  it('seals the session in an HttpOnly, SameSite=Lax cookie', async () => {
    const client = new Client(app.url)
    const reply = await client.post('/api/auth/sign-in', { email: 'nurse@demo.tidewell.test', password: DEMO_PASSWORD })
    const cookie = reply.headers.getSetCookie().join('\n')
    expect(cookie).toMatch(/tidewell-session=/)
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
    expect(cookie).not.toMatch(/Secure/i)
    expect(reply.body.user.patientId).toBeNull()
  })

  it('answers one vague 401 for a wrong password, an unknown e-mail and a malformed body', async () => {
    const client = new Client(app.url)
    const wrong = await client.post('/api/auth/sign-in', { email: 'clinician@demo.tidewell.test', password: 'not-the-password' })
    const unknown = await client.post('/api/auth/sign-in', { email: 'nobody@demo.tidewell.test', password: 'not-the-password' })
    const malformed = await client.post('/api/auth/sign-in', { email: 'not an e-mail' })
    for (const reply of [wrong, unknown, malformed]) {
      expect(reply.status).toBe(401)
      expect(reply.body.message).toBe('errors.signInFailed')
    }
  })

  it('signs out', async () => {
    const client = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    expect((await client.post('/api/auth/sign-out')).status).toBe(200)
    expect((await client.get('/api/users')).status).toBe(401)
  })
})

describe('lockout after repeated failures', () => {
  it('gives 429 with Retry-After after 5 failures from one address, even for the right password, and still after a restart', async () => {
    const email = 'bernard@demo.tidewell.test'
    const client = new Client(app.url)
    for (let i = 0; i < 5; i++) {
      expect((await client.post('/api/auth/sign-in', { email, password: `wrong-${i}-password` })).status).toBe(401)
    }
    const locked = await client.post('/api/auth/sign-in', { email, password: DEMO_PASSWORD })
    expect(locked.status).toBe(429)
    // A growing wait, not a long lock (sign-in-limit.ts): 30 s after the fifth failure.
    const retryAfter = Number(locked.headers.get('retry-after'))
    expect(retryAfter).toBeGreaterThan(0)
    expect(retryAfter).toBeLessThanOrEqual(30)

    // Another account is not affected.
    expect((await client.post('/api/auth/sign-in', { email: 'odell@demo.tidewell.test', password: DEMO_PASSWORD })).status).toBe(200)

    // The count lives in the database: a restarted server still refuses.
    await app.stop({ keepData: true })
    app = await startApp({ smtpUrl: mail.url, dataDir: app.dataDir })
    const again = await new Client(app.url).post('/api/auth/sign-in', { email, password: DEMO_PASSWORD })
    expect(again.status).toBe(429)
  })
})

describe('invitations and password resets', () => {
  it('an admin creates a patient; the invitation arrives over SMTP; its link sets a password exactly once', async () => {
    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    const created = await admin.post('/api/users', {
      email: 'new.patient@demo.tidewell.test',
      name: 'Anselm Grieve',
      role: 'patient',
      language: 'es',
      patient: { clinicNumber: 'LPU-2001', dateOfBirth: '1950-05-05' },
    })
    expect(created.status).toBe(201)
    expect(created.body).not.toHaveProperty('passwordHash')

    const invitation = await mail.waitFor(m => m.to.includes('new.patient@demo.tidewell.test'))
    expect(invitation.subject).toBe('Su cuenta de Tidewell está lista')
    expect(invitation.text).toContain('72 horas')
    const link = new URL(linkIn(invitation.text))
    expect(link.pathname).toBe('/set-password')
    const token = link.searchParams.get('token')!

    const visitor = new Client(app.url)
    const common = await visitor.post('/api/auth/set-password', { token, password: 'password1234' })
    expect(common.status).toBe(400)
    expect(common.body.data.fieldErrors.password).toContain('validation.password.common')

    expect((await visitor.post('/api/auth/set-password', { token, password: 'quiet harbour lanterns' })).status).toBe(200)
    expect((await visitor.post('/api/auth/set-password', { token, password: 'another fine sentence' })).status).toBe(400)

    const patient = await Client.signIn(app.url, 'new.patient@demo.tidewell.test', 'quiet harbour lanterns')
    expect((await patient.get('/api/_auth/session')).body.user.language).toBe('es')
  })

  it('refuses a duplicate e-mail with 409 and a message at the field', async () => {
    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    const reply = await admin.post('/api/users', { email: 'nurse@demo.tidewell.test', name: 'Someone', role: 'nurse' })
    expect(reply.status).toBe(409)
    expect(reply.body.data.fieldErrors.email).toEqual(['validation.alreadyExists'])
  })

  it('a nurse may create a patient but no staff account (admin, clinician or nurse)', async () => {
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    expect((await nurse.post('/api/users', { email: 'boss@demo.tidewell.test', name: 'Boss', role: 'admin' })).status).toBe(403)
    expect((await nurse.post('/api/users', { email: 'doc@demo.tidewell.test', name: 'Doc', role: 'clinician' })).status).toBe(403)
    expect((await nurse.post('/api/users', { email: 'rn@demo.tidewell.test', name: 'Rn', role: 'nurse' })).status).toBe(403)
    const ok = await nurse.post('/api/users', { email: 'p2@demo.tidewell.test', name: 'Quentin Aldous', role: 'patient', patient: { clinicNumber: 'LPU-2002', dateOfBirth: '1949-02-28' } })
    expect(ok.status).toBe(201)
  })

  it('forgot-password answers the same for a known and an unknown e-mail, and only the known one gets a link that works once', async () => {
    const visitor = new Client(app.url)
    const known = await visitor.post('/api/auth/forgot-password', { email: 'kenji@demo.tidewell.test' })
    const unknown = await visitor.post('/api/auth/forgot-password', { email: 'ghost@demo.tidewell.test' })
    expect(known.status).toBe(202)
    expect(unknown.status).toBe(known.status)
    expect(unknown.body).toEqual(known.body)

    const reset = await mail.waitFor(m => m.to.includes('kenji@demo.tidewell.test'))
    expect(reset.subject).toBe('Choose a new Tidewell password')
    expect(reset.html).toContain('<a href=')
    const token = new URL(linkIn(reset.text)).searchParams.get('token')!
    expect((await visitor.post('/api/auth/set-password', { token, password: 'low tide at the old pier' })).status).toBe(200)
    expect((await visitor.post('/api/auth/set-password', { token, password: 'low tide at the old pier' })).status).toBe(400)

    expect((await new Client(app.url).post('/api/auth/sign-in', { email: 'kenji@demo.tidewell.test', password: DEMO_PASSWORD })).status).toBe(401)
    await Client.signIn(app.url, 'kenji@demo.tidewell.test', 'low tide at the old pier')
    await new Promise(r => setTimeout(r, 500))
    expect(mail.messages.filter(m => m.to.includes('ghost@'))).toHaveLength(0)
  })
})
