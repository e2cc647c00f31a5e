import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { addCaregiver, patientIds } from '../support/circle'
import { Client, DEMO_PASSWORD, totpCode } from '../support/client'
import type { CaughtMessage } from '../support/mail-catcher'
import { linkIn, MailCatcher } from '../support/mail-catcher'

let app: RunningApp
let mail: MailCatcher
let ids: Record<string, number>
// One admin session for the whole file: each staff sign-in spends a second-factor time step.
let admin: Client

beforeAll(async () => {
  mail = await MailCatcher.start()
  app = await startApp({ smtpUrl: mail.url })
  ids = await patientIds(app.url)
  admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
})
afterAll(async () => {
  await app?.stop()
  await mail?.stop()
})

interface Account { id: number, email: string, active: boolean }

async function accountOf(email: string): Promise<Account> {
  const list = await admin.get('/api/users')
  expect(list.status).toBe(200)
  return (list.body as Account[]).find(u => u.email === email)!
}

async function auditLines(query: Record<string, string | number>) {
  const reply = await admin.get(`/api/audit?${new URLSearchParams(Object.entries(query).map(([k, v]) => [k, String(v)]))}`)
  expect(reply.status).toBe(200)
  return reply.body.events as { actor: { name: string } | null, actorRole: string, patient: { id: number } | null, action: string, resource: string }[]
}

/** Messages to one address caught since index `after`. */
const mailTo = (address: string, after: number) => mail.messages.filter((m, i) => i >= after && m.to.includes(address))

// Words of the diary, labs, triage and the schedule, in both languages: none belongs in a circle e-mail.
const HEALTH_WORDS = /diar|triag|lab|psa|testosteron|hba1c|qtc|symptom|síntoma|pain|dolor|injection|inyecci|flare|brote|urgent|LPU-/i

function expectNoHealthData(message: CaughtMessage, greeting: string) {
  const words = `${message.subject}\n${message.text}`.replace(/Tidewell does not replace medical advice[^\n]*|Tidewell no sustituye el consejo médico[^\n]*/, '')
  expect(words).not.toMatch(HEALTH_WORDS)
  expect(message.text).toContain(greeting)
}

describe('an admin deactivates an account', () => {
  it('ends his open session at once, refuses his sign-in like a wrong password, and reactivated he signs in again', async () => {
    const odell = await Client.signIn(app.url, 'odell@demo.tidewell.test')
    const patientId = ids['LPU-1004']!
    expect((await odell.get(`/api/patients/${patientId}`)).status).toBe(200)
    const account = await accountOf('odell@demo.tidewell.test')
    expect(account.active).toBe(true)

    const copied = odell.cookieHeader()
    const off = await admin.post(`/api/users/${account.id}/deactivate`)
    expect(off.status, JSON.stringify(off.body)).toBe(200)
    expect(off.body).toEqual({ id: account.id, active: false, sessionsEnded: 1 })
    expect((await odell.get(`/api/patients/${patientId}`)).status).toBe(401)
    // A copy of the cookie is as dead, for the session read the pages make too.
    for (const path of [`/api/patients/${patientId}`, '/api/_auth/session']) {
      expect((await fetch(new URL(path, app.url), { headers: { cookie: copied } })).status, path).toBe(401)
    }
    expect((await accountOf('odell@demo.tidewell.test')).active).toBe(false)

    const wrong = await new Client(app.url).post('/api/auth/sign-in', { email: 'odell@demo.tidewell.test', password: 'not his password at all' })
    const refused = await new Client(app.url).post('/api/auth/sign-in', { email: 'odell@demo.tidewell.test', password: DEMO_PASSWORD })
    expect(refused.status).toBe(401)
    expect(refused.body.message).toBe('errors.signInFailed')
    expect([wrong.status, wrong.body.message]).toEqual([refused.status, refused.body.message])
    // A second deactivation (another admin at the same moment) changes nothing.
    const twice = await admin.post(`/api/users/${account.id}/deactivate`)
    expect(twice.status).toBe(409)
    expect(twice.body.message).toBe('errors.accountAlreadyInactive')

    const on = await admin.post(`/api/users/${account.id}/reactivate`)
    expect(on.status).toBe(200)
    expect(on.body).toEqual({ id: account.id, active: true, sessionsEnded: 0 })
    expect((await admin.post(`/api/users/${account.id}/reactivate`)).status).toBe(409)
    const back = await Client.signIn(app.url, 'odell@demo.tidewell.test')
    expect((await back.get(`/api/patients/${patientId}`)).status).toBe(200)
    // The old cookie stays ended.
    expect((await fetch(new URL(`/api/patients/${patientId}`, app.url), { headers: { cookie: copied } })).status).toBe(401)

    const lines = await auditLines({ action: 'user.deactivate' })
    expect(lines).toHaveLength(1)
    expect(lines[0]).toMatchObject({ actor: { name: 'Priya Castellanos' }, actorRole: 'admin', patient: { id: patientId }, resource: `user:${account.id}` })
    expect(await auditLines({ action: 'user.reactivate' })).toMatchObject([{ patient: { id: patientId }, resource: `user:${account.id}` }])
  })

  it('a staff account switched off between password and code gets no session from the code', async () => {
    const account = await accountOf('nurse2@demo.tidewell.test')
    const nurse = new Client(app.url)
    const first = await nurse.post('/api/auth/sign-in', { email: 'nurse2@demo.tidewell.test', password: DEMO_PASSWORD })
    expect(first.body.secondFactor).toBe('verify')
    expect((await admin.post(`/api/users/${account.id}/deactivate`)).status).toBe(200)
    const code = await nurse.post('/api/auth/totp/verify', { code: await totpCode(app.url, 'nurse2@demo.tidewell.test') })
    expect(code.status).toBe(401)
    expect((await nurse.get('/api/patients')).status).toBe(401)
    // A staff account's audit line names no patient.
    expect((await auditLines({ action: 'user.deactivate' })).find(l => l.resource === `user:${account.id}`)!.patient).toBeNull()
    expect((await admin.post(`/api/users/${account.id}/reactivate`)).status).toBe(200)
    await Client.signIn(app.url, 'nurse2@demo.tidewell.test')
  })

  it('is for admins only, never of his own account, and only of an account that exists', async () => {
    const target = await accountOf('desmond@demo.tidewell.test')
    const self = await accountOf('admin@demo.tidewell.test')
    for (const email of ['nurse@demo.tidewell.test', 'clinician@demo.tidewell.test', 'patient@demo.tidewell.test', 'caregiver@demo.tidewell.test']) {
      const someone = await Client.signIn(app.url, email)
      expect((await someone.post(`/api/users/${target.id}/deactivate`)).status, email).toBe(403)
      expect((await someone.post(`/api/users/${target.id}/reactivate`)).status, email).toBe(403)
    }
    expect((await new Client(app.url).post(`/api/users/${target.id}/deactivate`)).status).toBe(401)
    expect((await accountOf('desmond@demo.tidewell.test')).active).toBe(true)

    const own = await admin.post(`/api/users/${self.id}/deactivate`)
    expect(own.status).toBe(400)
    expect(own.body.message).toBe('errors.notYourOwnAccount')
    expect((await admin.get('/api/users')).status).toBe(200)
    expect((await admin.post('/api/users/999999/deactivate')).status).toBe(404)
    expect((await admin.post('/api/users/abc/deactivate')).status).toBe(404)
    expect(await auditLines({ action: 'user.deactivate' })).not.toContainEqual(expect.objectContaining({ resource: `user:${target.id}` }))
  })
})

describe('staff changing a patient\'s care circle', () => {
  it('e-mails the patient in his language for each change, with a link to review it and no health data; a removed caregiver is told too', async () => {
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const patientId = ids['LPU-1003']!
    const luis = 'luis@demo.tidewell.test'
    const start = mail.messages.length
    const { grantId } = await addCaregiver(app.url, mail, nurse, patientId, { email: 'paloma@demo.tidewell.test', name: 'Paloma Ruiz Calderón', language: 'es' })

    const invited = await mail.waitFor(m => m.to.includes(luis) && mail.messages.indexOf(m) >= start)
    expect(invited.subject).toBe('La clínica cambió su círculo de cuidado en Tidewell')
    expectNoHealthData(invited, 'Hola, Luis Calderón Ybarra:')
    expect(invited.text).not.toContain('Paloma')
    expect(invited.text).toContain('no esperaba este cambio')
    expect(new URL(linkIn(invited.text)).pathname).toBe('/circle')

    const beforeChange = mail.messages.length
    expect((await nurse.patch(`/api/patients/${patientId}/circle/${grantId}`, { canLogDiary: true, canManageAppointments: true })).status).toBe(200)
    const changed = await mail.waitFor(m => m.to.includes(luis) && mail.messages.indexOf(m) >= beforeChange)
    expectNoHealthData(changed, 'Hola, Luis Calderón Ybarra:')

    const beforeRemoval = mail.messages.length
    expect((await nurse.delete(`/api/patients/${patientId}/circle/${grantId}`)).status).toBe(204)
    const removed = await mail.waitFor(m => m.to.includes(luis) && mail.messages.indexOf(m) >= beforeRemoval)
    expectNoHealthData(removed, 'Hola, Luis Calderón Ybarra:')
    const told = await mail.waitFor(m => m.to.includes('paloma@demo.tidewell.test') && mail.messages.indexOf(m) >= beforeRemoval)
    expect(told.subject).toBe('Terminó su lugar en un círculo de cuidado de Tidewell')
    expectNoHealthData(told, 'Hola, Paloma Ruiz Calderón:')
    expect(told.text).not.toMatch(/Luis|Calderón Ybarra/)
    expect(mailTo(luis, start)).toHaveLength(3)
  })

  it('an English-speaking patient gets it in English; withdrawing an invitation counts as a change', async () => {
    const patientId = ids['LPU-1009']!
    const before = mail.messages.length
    const sent = await admin.post(`/api/patients/${patientId}/circle`, { name: 'Rowan Laurier', email: 'rowan@demo.tidewell.test', canLogDiary: false, canManageAppointments: false })
    expect(sent.status).toBe(201)
    const invited = await mail.waitFor(m => m.to.includes('desmond@demo.tidewell.test') && mail.messages.indexOf(m) >= before)
    expect(invited.subject).toBe('The clinic changed your care circle in Tidewell')
    expectNoHealthData(invited, 'Hello Desmond Laurier,')
    expect(invited.text).toContain('If you did not expect this change')
    const beforeWithdraw = mail.messages.length
    expect((await admin.delete(`/api/patients/${patientId}/circle/invitations/${sent.body.id}`)).status).toBe(204)
    await mail.waitFor(m => m.to.includes('desmond@demo.tidewell.test') && mail.messages.indexOf(m) >= beforeWithdraw)
  })

  it('the patient changing his own circle is not e-mailed about it (the caregiver he removes is)', async () => {
    const kenji = await Client.signIn(app.url, 'kenji@demo.tidewell.test')
    const patientId = ids['LPU-1006']!
    const start = mail.messages.length
    const { grantId } = await addCaregiver(app.url, mail, kenji, patientId, { email: 'haruto@demo.tidewell.test', name: 'Haruto Arakawa' })
    expect((await kenji.patch(`/api/patients/${patientId}/circle/${grantId}`, { canLogDiary: true, canManageAppointments: false })).status).toBe(200)
    expect((await kenji.delete(`/api/patients/${patientId}/circle/${grantId}`)).status).toBe(204)
    const told = await mail.waitFor(m => m.to.includes('haruto@demo.tidewell.test') && m.subject.includes('has ended'))
    expectNoHealthData(told, 'Hello Haruto Arakawa,')
    expect(told.text).not.toContain('Kenji')
    // A change by a nurse afterwards is mailed: once it arrives, the patient's own changes had their turn.
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const marker = await nurse.post(`/api/patients/${patientId}/circle`, { name: 'Someone', email: 'someone-else@demo.tidewell.test', canLogDiary: false, canManageAppointments: false })
    expect(marker.status).toBe(201)
    await mail.waitFor(m => m.to.includes('kenji@demo.tidewell.test') && mail.messages.indexOf(m) >= start)
    await mail.waitFor(m => m.to.includes('someone-else@demo.tidewell.test'))
    expect(mailTo('kenji@demo.tidewell.test', start).map(m => m.subject)).toEqual(['The clinic changed your care circle in Tidewell'])
  })
})

function sessionCookies(reply: { headers: Headers }) {
  return reply.headers.getSetCookie().filter(line => line.startsWith('tidewell-session='))
}

describe('the Secure cookie flag follows the public URL\'s scheme', () => {
  it('plain http: the session cookie is not Secure, so a browser on a local network address keeps it', async () => {
    const client = new Client(app.url)
    const reply = await client.post('/api/auth/sign-in', { email: 'bernard@demo.tidewell.test', password: DEMO_PASSWORD })
    expect(reply.status).toBe(200)
    const cookies = sessionCookies(reply)
    expect(cookies.length).toBeGreaterThan(0)
    for (const line of cookies) {
      expect(line).not.toMatch(/;\s*secure/i)
      expect(line).toMatch(/;\s*httponly/i)
      expect(line).toMatch(/;\s*samesite=lax/i)
    }
    expect((await client.get(`/api/patients/${ids['LPU-1002']}`)).status).toBe(200)
  })

  it('https: the same build sets Secure on every session cookie, staff second factor and sign-out included', async () => {
    const secure = await startApp({ env: { NUXT_PUBLIC_URL: 'https://tidewell.example.test' } })
    try {
      const patient = new Client(secure.url)
      const signedIn = await patient.post('/api/auth/sign-in', { email: 'bernard@demo.tidewell.test', password: DEMO_PASSWORD })
      expect(signedIn.status).toBe(200)
      const nurse = new Client(secure.url)
      const first = await nurse.post('/api/auth/sign-in', { email: 'nurse@demo.tidewell.test', password: DEMO_PASSWORD })
      const second = await nurse.post('/api/auth/totp/verify', { code: await totpCode(secure.url, 'nurse@demo.tidewell.test') })
      expect(second.status).toBe(200)
      const out = await patient.post('/api/auth/sign-out')
      const lines = [signedIn, first, second, out].flatMap(sessionCookies)
      expect(lines.length).toBeGreaterThanOrEqual(4)
      for (const line of lines) expect(line).toMatch(/;\s*secure/i)
    }
    finally {
      await secure.stop()
    }
  })
})
