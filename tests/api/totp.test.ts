import { generate } from 'otplib'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client, DEMO_PASSWORD, DEMO_TOTP_SECRET, totpCode } from '../support/client'
import { linkIn, MailCatcher } from '../support/mail-catcher'
import { sql } from '../support/sqlite'

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

const PASSWORD = 'quiet harbour lanterns at dusk'

/** A new clinician, invited by the admin, with his password set: not enrolled yet. */
async function newClinician(email: string) {
  const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
  expect((await admin.post('/api/users', { email, name: 'Oren Vasquez-Thale', role: 'clinician', language: 'en' })).status).toBe(201)
  const invitation = await mail.waitFor(m => m.to.includes(email))
  const token = new URL(linkIn(invitation.text)).searchParams.get('token')!
  expect((await new Client(app.url).post('/api/auth/set-password', { token, password: PASSWORD })).status).toBe(200)
}

describe('second factor', () => {
  it('a staff member past the password but before the code is refused by data routes', async () => {
    const client = new Client(app.url)
    const reply = await client.post('/api/auth/sign-in', { email: 'nurse@demo.tidewell.test', password: DEMO_PASSWORD })
    expect(reply.status).toBe(200)
    expect(reply.body.secondFactor).toBe('verify')
    expect((await client.get('/api/triage')).status).toBe(401)
    expect((await client.get('/api/_auth/session')).body.user).toBeUndefined()
    const wrong = await client.post('/api/auth/totp/verify', { code: '000000' === await generate({ secret: DEMO_TOTP_SECRET }) ? '111111' : '000000' })
    expect(wrong.status).toBe(401)
    expect((await client.post('/api/auth/totp/verify', { code: await totpCode(app.url, 'nurse@demo.tidewell.test') })).status).toBe(200)
    expect((await client.get('/api/triage')).status).toBe(200)
  })

  it('enrols at first sign-in, signs in with a generated code, a recovery code works once, a code once', async () => {
    const email = 'oren@demo.tidewell.test'
    await newClinician(email)
    const client = new Client(app.url)
    expect((await client.post('/api/auth/sign-in', { email, password: PASSWORD })).body.secondFactor).toBe('enrol')
    expect((await client.get('/api/triage')).status).toBe(401)
    const enrolment = await client.post('/api/auth/totp/enrol')
    expect(enrolment.status).toBe(200)
    expect(enrolment.body.qr).toMatch(/^data:image\/svg\+xml;base64,/)
    expect(enrolment.body.uri).toContain(`secret=${enrolment.body.secret}`)
    const secret: string = enrolment.body.secret
    const stored = await sql<{ s: string | null, p: string | null }>(app, 'SELECT totp_secret AS s, totp_pending_secret AS p FROM users WHERE email = ?', [email])
    expect(stored[0]!.p).not.toContain(secret)

    const confirmed = await client.post('/api/auth/totp/confirm', { code: await totpCode(app.url, email, secret) })
    expect(confirmed.status).toBe(200)
    const recoveryCodes: string[] = confirmed.body.recoveryCodes
    expect(recoveryCodes).toHaveLength(10)
    expect((await client.get('/api/triage')).status).toBe(200)
    // Never shown again.
    expect((await client.post('/api/auth/totp/enrol')).status).toBe(409)

    const again = new Client(app.url)
    expect((await again.post('/api/auth/sign-in', { email, password: PASSWORD })).body.secondFactor).toBe('verify')
    const code = await totpCode(app.url, email, secret)
    expect((await again.post('/api/auth/totp/verify', { code })).status).toBe(200)
    // The same code a second time is refused.
    const replay = new Client(app.url)
    await replay.post('/api/auth/sign-in', { email, password: PASSWORD })
    expect((await replay.post('/api/auth/totp/verify', { code })).status).toBe(401)

    const withRecovery = new Client(app.url)
    await withRecovery.post('/api/auth/sign-in', { email, password: PASSWORD })
    expect((await withRecovery.post('/api/auth/totp/verify', { recoveryCode: recoveryCodes[0] })).status).toBe(200)
    const spent = new Client(app.url)
    await spent.post('/api/auth/sign-in', { email, password: PASSWORD })
    expect((await spent.post('/api/auth/totp/verify', { recoveryCode: recoveryCodes[0] })).status).toBe(401)
  })

  it('after 5 wrong codes the next try waits, even with the right code', async () => {
    const email = 'clinician@demo.tidewell.test'
    const client = new Client(app.url)
    await client.post('/api/auth/sign-in', { email, password: DEMO_PASSWORD })
    const right = await generate({ secret: DEMO_TOTP_SECRET })
    const wrongCode = right === '123456' ? '654321' : '123456'
    for (let i = 0; i < 5; i++) expect((await client.post('/api/auth/totp/verify', { code: wrongCode })).status).toBe(401)
    const locked = await client.post('/api/auth/totp/verify', { code: await totpCode(app.url, email) })
    expect(locked.status).toBe(429)
    expect(Number(locked.headers.get('retry-after'))).toBeGreaterThan(0)
  })
})
