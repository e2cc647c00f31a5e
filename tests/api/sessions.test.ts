import { createHash } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client, DEMO_PASSWORD } from '../support/client'
import { linkIn, MailCatcher } from '../support/mail-catcher'
import { sql } from '../support/sqlite'

/*
 * Revocable sessions (issue 11): every signed-in request needs its user_sessions row to be
 * live (server/utils/auth/sessions.ts). A copied cookie stops working at sign-out, sign-out
 * everywhere and a password reset; an idle session ends; one reset link spends the others.
 * The idle tests judge a request as of a later time with the clock header, which the server
 * honours only with NUXT_ALLOW_CLOCK_OVERRIDE (tests/support/app.ts sets it).
 */
const CLOCK = 'x-tidewell-clock'
const MINUTE = 60_000

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

/**
 * A second client holding a copy of the first one's cookies, as a thief would. (Client
 * obeys the server's cookie clearing after a 401; a thief would not, so take a new copy.)
 */
function copyOf(client: Client): Client {
  const copy = new Client(client.baseUrl)
  const cookies = (client as unknown as { cookies: Map<string, string> }).cookies
  ;(copy as unknown as { cookies: Map<string, string> }).cookies = new Map(cookies)
  return copy
}

async function scheduleOf(client: Client) {
  const { body } = await client.get('/api/_auth/session')
  return `/api/patients/${body.user.patientId}/schedule`
}

const at = (client: Client, path: string, when: Date) => client.request('GET', path, undefined, { [CLOCK]: when.toISOString() })

async function resetLinks(email: string, count: number): Promise<string[]> {
  const visitor = new Client(app.url)
  for (let i = 0; i < count; i++) expect((await visitor.post('/api/auth/forgot-password', { email })).status).toBe(202)
  const deadline = Date.now() + 15_000
  while (mail.messages.filter(m => m.to.includes(email)).length < count && Date.now() < deadline) await new Promise(r => setTimeout(r, 100))
  const tokens = mail.messages.filter(m => m.to.includes(email)).map(m => new URL(linkIn(m.text)).searchParams.get('token')!)
  expect(tokens).toHaveLength(count)
  // Oldest first, by the order the server issued them.
  const ids = new Map<string, number>()
  for (const token of tokens) {
    const [row] = await sql<{ id: number }>(app, 'SELECT id FROM one_time_tokens WHERE token_hash = ?', [createHash('sha256').update(token).digest('hex')])
    ids.set(token, row!.id)
  }
  return tokens.sort((a, b) => ids.get(a)! - ids.get(b)!)
}

describe('revocable sessions', () => {
  it('a cookie copied before sign-out answers 401 afterwards, on an API route and on /api/_auth/session', async () => {
    const patient = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const schedule = await scheduleOf(patient)
    const copy = copyOf(patient)
    const another = copyOf(patient)
    expect((await copy.get(schedule)).status).toBe(200)
    expect((await another.get('/api/_auth/session')).body.user.name).toBe('Elias Marwood')

    // The row id stays on the server: the client's view of the session does not carry it.
    const [row] = await sql<{ id: string }>(app, `SELECT s.id FROM user_sessions s JOIN users u ON u.id = s.user_id WHERE u.email = 'patient@demo.tidewell.test' AND s.ended_at IS NULL`)
    expect(row!.id.length).toBeGreaterThanOrEqual(32)
    expect(JSON.stringify((await patient.get('/api/_auth/session')).body)).not.toContain(row!.id)

    expect((await patient.post('/api/auth/sign-out')).status).toBe(200)
    const api = await copy.get(schedule)
    expect(api.status).toBe(401)
    expect(api.body.message).toBe('errors.signedOut')
    expect((await another.get('/api/_auth/session')).status).toBe(401)
    const [ended] = await sql<{ ended_reason: string }>(app, 'SELECT ended_reason FROM user_sessions WHERE id = ?', [row!.id])
    expect(ended!.ended_reason).toBe('sign-out')
  })

  it('clearing the session through nuxt-auth-utils (DELETE /api/_auth/session) ends its row too', async () => {
    const patient = await Client.signIn(app.url, 'bernard@demo.tidewell.test')
    const schedule = await scheduleOf(patient)
    const copy = copyOf(patient)
    expect((await patient.delete('/api/_auth/session')).status).toBe(200)
    expect((await copy.get(schedule)).status).toBe(401)
  })

  it('signing in again in the same browser ends the session it replaces', async () => {
    const nurse = await Client.signIn(app.url, 'clinician@demo.tidewell.test')
    const before = copyOf(nurse)
    expect((await before.get('/api/due-list')).status).toBe(200)
    const again = await nurse.post('/api/auth/sign-in', { email: 'clinician@demo.tidewell.test', password: DEMO_PASSWORD })
    expect(again.body.secondFactor).toBe('verify')
    expect((await copyOf(before).get('/api/due-list')).status).toBe(401)
    const patient = await Client.signIn(app.url, 'desmond@demo.tidewell.test')
    const old = copyOf(patient)
    const schedule = await scheduleOf(patient)
    expect((await patient.post('/api/auth/sign-in', { email: 'desmond@demo.tidewell.test', password: DEMO_PASSWORD })).status).toBe(200)
    expect((await patient.get(schedule)).status).toBe(200)
    expect((await old.get(schedule)).status).toBe(401)
  })

  it('sign-out-everywhere ends his session on another device and leaves other people signed in', async () => {
    const phone = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    const laptop = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    const laptopCopy = copyOf(laptop)
    const someoneElse = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const schedule = await scheduleOf(someoneElse)
    expect((await laptop.get(schedule)).status).toBe(200)

    expect((await phone.post('/api/auth/sign-out-everywhere')).status).toBe(200)
    expect((await laptop.get(schedule)).status).toBe(401)
    expect((await laptopCopy.get('/api/_auth/session')).status).toBe(401)
    expect((await phone.get(schedule)).status).toBe(401)
    expect((await someoneElse.get(schedule)).status).toBe(200)
    const reasons = await sql<{ ended_reason: string }>(app, `SELECT ended_reason FROM user_sessions s JOIN users u ON u.id = s.user_id WHERE u.email = 'caregiver@demo.tidewell.test'`)
    expect(reasons.map(r => r.ended_reason)).toEqual(['sign-out-everywhere', 'sign-out-everywhere'])
    // Signing out everywhere needs a live session.
    expect((await new Client(app.url).post('/api/auth/sign-out-everywhere')).status).toBe(401)
  })

  it('after a password reset a session from before it answers 401, and the new password signs in', async () => {
    const before = await Client.signIn(app.url, 'odell@demo.tidewell.test')
    const schedule = await scheduleOf(before)
    expect((await before.get(schedule)).status).toBe(200)
    const [token] = await resetLinks('odell@demo.tidewell.test', 1)
    expect((await new Client(app.url).post('/api/auth/set-password', { token, password: 'gulls over the breakwater' })).status).toBe(200)

    const stale = await before.get(schedule)
    expect(stale.status).toBe(401)
    expect(stale.body.message).toBe('errors.signedOut')
    const after = await Client.signIn(app.url, 'odell@demo.tidewell.test', 'gulls over the breakwater')
    expect((await after.get(schedule)).status).toBe(200)
  })

  it('with three reset links outstanding, using the newest makes the two older ones fail', async () => {
    const [oldest, older, newest] = await resetLinks('franklin@demo.tidewell.test', 3)
    const visitor = new Client(app.url)
    expect((await visitor.post('/api/auth/set-password', { token: newest, password: 'the ferry leaves at nine' })).status).toBe(200)
    for (const token of [older, oldest]) {
      const reply = await visitor.post('/api/auth/set-password', { token, password: 'someone else chose this one' })
      expect(reply.status).toBe(400)
      expect(reply.body.message).toBe('errors.linkInvalid')
    }
    await Client.signIn(app.url, 'franklin@demo.tidewell.test', 'the ferry leaves at nine')
    expect((await new Client(app.url).post('/api/auth/sign-in', { email: 'franklin@demo.tidewell.test', password: 'someone else chose this one' })).status).toBe(401)
  })

  it('a live session keeps working, and a request within a minute of the last one sets no new cookie', async () => {
    const patient = await Client.signIn(app.url, 'luis@demo.tidewell.test')
    const schedule = await scheduleOf(patient)
    for (let i = 0; i < 5; i++) {
      const reply = await patient.get(schedule)
      expect(reply.status).toBe(200)
      expect(reply.headers.getSetCookie()).toEqual([])
    }
  })

  it('idle past the patient limit (60 min) answers 401 errors.sessionIdle; activity within it keeps the session', async () => {
    const patient = await Client.signIn(app.url, 'ramon@demo.tidewell.test')
    const schedule = await scheduleOf(patient)
    const start = Date.now()
    const kept = await at(patient, schedule, new Date(start + 59 * MINUTE))
    expect(kept.status).toBe(200)
    // Seen again: a new cookie with the new last-seen time.
    expect(kept.headers.getSetCookie().join('\n')).toMatch(/tidewell-session=/)
    expect((await at(patient, schedule, new Date(start + 118 * MINUTE))).status).toBe(200)

    const copy = copyOf(patient)
    const another = copyOf(patient)
    const idle = await at(patient, schedule, new Date(start + 180 * MINUTE))
    expect(idle.status).toBe(401)
    expect(idle.body.message).toBe('errors.sessionIdle')
    // The row is ended: the copied cookie, even judged as of now, stays refused, with the reason.
    const later = await copy.get(schedule)
    expect(later.status).toBe(401)
    expect(later.body.message).toBe('errors.sessionIdle')
    const session = await another.get('/api/_auth/session')
    expect(session.status).toBe(401)
    expect(session.body.message).toBe('errors.sessionIdle')
    const [row] = await sql<{ ended_reason: string }>(app, `SELECT ended_reason FROM user_sessions s JOIN users u ON u.id = s.user_id WHERE u.email = 'ramon@demo.tidewell.test'`)
    expect(row!.ended_reason).toBe('idle')
  })

  it('staff have the shorter limit (15 min), which an admin can change in the clinic settings', async () => {
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const start = Date.now()
    expect((await at(nurse, '/api/due-list', new Date(start + 14 * MINUTE))).status).toBe(200)
    const idle = await at(nurse, '/api/due-list', new Date(start + 30 * MINUTE))
    expect(idle.status).toBe(401)
    expect(idle.body.message).toBe('errors.sessionIdle')

    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    const current = (await admin.get('/api/admin/settings')).body
    expect(current).toMatchObject({ idleMinutesPatient: 60, idleMinutesStaff: 15 })
    expect((await admin.put('/api/admin/settings', { ...current, idleMinutesStaff: 0 })).status).toBe(400)
    expect((await admin.put('/api/admin/settings', { ...current, idleMinutesStaff: 45 })).status).toBe(200)
    const again = await Client.signIn(app.url, 'nurse2@demo.tidewell.test')
    const now = Date.now()
    expect((await at(again, '/api/due-list', new Date(now + 40 * MINUTE))).status).toBe(200)
    expect((await at(again, '/api/due-list', new Date(now + 40 * MINUTE + 46 * MINUTE))).status).toBe(401)
  })
})
