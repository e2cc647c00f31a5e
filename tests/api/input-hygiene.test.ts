import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { MailCatcher } from '../support/mail-catcher'
import { sql } from '../support/sqlite'

/*
 * Issue 11, input hygiene, through the built server: text with NUL, control or bidi
 * characters answers 400 with a field message (never a 500) and stores nothing; true is
 * never a number or an id; ordinary names with accents still go through.
 */

let app: RunningApp
let mail: MailCatcher
let nurse: Client
let clinician: Client
let admin: Client
let ids: Record<string, number>
let today: string

beforeAll(async () => {
  mail = await MailCatcher.start()
  app = await startApp({ smtpUrl: mail.url })
  nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
  clinician = await Client.signIn(app.url, 'clinician@demo.tidewell.test')
  admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
  const roster = (await nurse.get('/api/patients')).body as { id: number, clinicNumber: string }[]
  ids = Object.fromEntries(roster.map(p => [p.clinicNumber, p.id]))
  today = (await nurse.get(`/api/patients/${ids['LPU-1001']}/labs`)).body.today
})
afterAll(async () => {
  await app?.stop()
  await mail?.stop()
})

const count = async (table: string, where = '1 = 1', params: unknown[] = []) =>
  (await sql<{ n: number }>(app, `SELECT COUNT(*) AS n FROM ${table} WHERE ${where}`, params))[0]!.n

describe('hidden and control characters in text', () => {
  it('a NUL byte in a regimen name answers 400 with the field message, not 500, and stores nothing', async () => {
    const before = await count('regimens')
    const reply = await clinician.post('/api/regimens', { name: '6-month\u0000 depot', intervalDays: 168 })
    expect(reply.status, JSON.stringify(reply.body)).toBe(400)
    expect(reply.body.data.fieldErrors).toEqual({ name: ['validation.text.unsafe'] })
    const escape = await clinician.post('/api/regimens', { name: '\u001b[31m6-month depot', intervalDays: 168 })
    expect(escape.status).toBe(400)
    expect(escape.body.data.fieldErrors).toEqual({ name: ['validation.text.unsafe'] })
    expect(await count('regimens')).toBe(before)
  })

  it('a NUL byte in the queue search answers 400 with a field error on q, not 500', async () => {
    const reply = await nurse.get('/api/triage?q=Mar%00wood')
    expect(reply.status, JSON.stringify(reply.body)).toBe(400)
    expect(reply.body.data.fieldErrors).toEqual({ q: ['validation.text.unsafe'] })
    expect((await nurse.get('/api/triage?q=%E2%80%AEdoow')).status).toBe(400)
    expect((await nurse.get(`/api/triage?q=${encodeURIComponent('Núñez')}`)).status).toBe(200)
  })

  it('a caregiver invitation whose name holds a right-to-left override is refused; no invitation, no e-mail', async () => {
    const franklin = await Client.signIn(app.url, 'franklin@demo.tidewell.test')
    const patientId = ids['LPU-1005']!
    const before = await count('circle_invitations')
    const reply = await franklin.post(`/api/patients/${patientId}/circle`, {
      name: 'Ada \u202Eesnem-iseo', email: 'rlo-guest@demo.tidewell.test', language: 'en', canLogDiary: false, canManageAppointments: false,
    })
    expect(reply.status, JSON.stringify(reply.body)).toBe(400)
    expect(reply.body.data.fieldErrors).toEqual({ name: ['validation.text.unsafe'] })
    expect(await count('circle_invitations')).toBe(before)
    expect(mail.messages.filter(m => m.to.includes('rlo-guest@demo.tidewell.test'))).toEqual([])
  })

  it('a patient account whose name holds a bidi override, an isolate or a C1 control is refused and not stored', async () => {
    for (const [i, name] of ['Elías \u202EzeráM', 'Elías \u2066Márez', 'Elías\u0085Márez'].entries()) {
      const email = `bidi-${i}@demo.tidewell.test`
      const reply = await admin.post('/api/users', { email, name, role: 'patient', patient: { clinicNumber: `LPU-88${i}`, dateOfBirth: '1951-03-04' } })
      expect(reply.status, JSON.stringify(reply.body)).toBe(400)
      expect(reply.body.data.fieldErrors).toEqual({ name: ['validation.text.unsafe'] })
      expect(await count('users', 'email = ?', [email])).toBe(0)
    }
  })

  it('ordinary names with accents, apostrophes and a multi-line note still go through', async () => {
    const created = await admin.post('/api/users', { email: 'jose.nunez@demo.tidewell.test', name: 'José Ñúñez O\'Dálaigh', role: 'patient', patient: { clinicNumber: 'LPU-8890', dateOfBirth: '1949-11-20' } })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    expect(created.body.name).toBe('José Ñúñez O\'Dálaigh')
    const regimen = await clinician.post('/api/regimens', { name: 'Pauta trimestral señalada', intervalDays: 90 })
    expect(regimen.status, JSON.stringify(regimen.body)).toBe(201)
    expect(regimen.body.name).toBe('Pauta trimestral señalada')
    const lab = await nurse.post(`/api/patients/${ids['LPU-1008']}/labs`, { kind: 'psa', takenOn: today, value: 0.5, note: 'Repetido.\nSin cambios.' })
    expect(lab.status, JSON.stringify(lab.body)).toBe(201)
    expect(lab.body.note).toBe('Repetido.\nSin cambios.')
  })
})

describe('no coercion of true or text into numbers and ids', () => {
  it('true as a PSA value answers 400 at value and stores nothing', async () => {
    const patientId = ids['LPU-1008']!
    const before = await count('lab_results', 'patient_id = ?', [patientId])
    for (const value of [true, '1e3', '0x1']) {
      const reply = await nurse.post(`/api/patients/${patientId}/labs`, { kind: 'psa', takenOn: today, value })
      expect(reply.status, String(value)).toBe(400)
      expect(reply.body.data.fieldErrors, String(value)).toEqual({ value: ['validation.labs.valueRequired'] })
    }
    expect(await count('lab_results', 'patient_id = ?', [patientId])).toBe(before)
  })

  it('true as a regimen id answers 400 at regimenId and leaves his regimen as it was', async () => {
    const patientId = ids['LPU-1005']!
    const before = await count('patient_regimens', 'patient_id = ?', [patientId])
    for (const regimenId of [true, '1']) {
      const reply = await nurse.put(`/api/patients/${patientId}/regimen`, { regimenId, startsOn: today })
      expect(reply.status, String(regimenId)).toBe(400)
      expect(reply.body.data.fieldErrors, String(regimenId)).toEqual({ regimenId: ['validation.schedule.regimenRequired'] })
    }
    expect(await count('patient_regimens', 'patient_id = ?', [patientId])).toBe(before)
    const trueInterval = await clinician.post('/api/regimens', { name: 'Every true days', intervalDays: true })
    expect(trueInterval.status).toBe(400)
    expect(trueInterval.body.data.fieldErrors).toEqual({ intervalDays: ['validation.schedule.intervalRange'] })
  })

  it('page queries take plain digits only: true, 1e3 and " 1" answer 400 with a field error', async () => {
    const patientId = ids['LPU-1001']!
    const elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    for (const bad of ['true', '1e3', '%201', '0x1']) {
      const queue = await nurse.get(`/api/triage?page=${bad}`)
      expect(queue.status, `queue ${bad}`).toBe(400)
      expect(Object.keys(queue.body.data.fieldErrors), `queue ${bad}`).toEqual(['page'])
      const diary = await nurse.get(`/api/patients/${patientId}/diary?pageSize=${bad}`)
      expect(diary.status, `diary ${bad}`).toBe(400)
      expect(Object.keys(diary.body.data.fieldErrors), `diary ${bad}`).toEqual(['pageSize'])
      const history = await elias.get(`/api/patients/${patientId}/access-history?page=${bad}`)
      expect(history.status, `history ${bad}`).toBe(400)
      expect(Object.keys(history.body.data.fieldErrors), `history ${bad}`).toEqual(['page'])
      const audit = await admin.get(`/api/audit?patient=${bad}`)
      expect(audit.status, `audit ${bad}`).toBe(400)
      expect(Object.keys(audit.body.data.fieldErrors), `audit ${bad}`).toEqual(['patient'])
    }
    expect((await nurse.get('/api/triage?page=1&pageSize=10')).body).toMatchObject({ page: 1, pageSize: 10 })
    expect((await nurse.get(`/api/patients/${patientId}/diary?page=1`)).status).toBe(200)
  })
})
