import { DateTime } from 'luxon'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { patientIds } from '../support/circle'
import { Client } from '../support/client'
import { refuseInserts, sql } from '../support/sqlite'

/*
 * Issue 11, "Audit what happened": the audit line says what the request did (done, refused
 * as invalid, ...), server renders record the browser's address, list reads name the
 * patients shown, and the patient's access history groups repeats.
 */
let app: RunningApp
let ids: Record<string, number>
let userIds: Record<string, number>

interface Group { day: string, kind: 'read' | 'change' | 'refused', count: number, actions: string[], actor: { name: string, role: string } }

beforeAll(async () => {
  app = await startApp()
  ids = await patientIds(app.url)
  const users = await sql<{ id: number, email: string }>(app, 'SELECT id, email FROM users')
  userIds = Object.fromEntries(users.map(u => [u.email.split('@')[0], u.id]))
})
afterAll(async () => {
  await app?.stop()
})

const clinicToday = () => DateTime.now().setZone('America/Chicago').toISODate()!
const lastId = async () => (await sql<{ id: number | null }>(app, 'SELECT MAX(id) AS id FROM audit_events'))[0]!.id ?? 0
const historyOf = async (patient: Client, patientId: number) => {
  const reply = await patient.get(`/api/patients/${patientId}/access-history`)
  expect(reply.status).toBe(200)
  return reply.body.groups as Group[]
}

describe('the outcome is recorded after the work', () => {
  it('20 invalid lab results by a nurse show as refused, not as changes; a valid one as a change', async () => {
    const howard = ids['LPU-1011']!
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const patient = await Client.signIn(app.url, 'howard@demo.tidewell.test')
    const before = await lastId()
    for (let i = 0; i < 20; i++) {
      const reply = await nurse.post(`/api/patients/${howard}/labs`, { kind: 'psa', takenOn: clinicToday(), value: `not a number ${i}` })
      expect(reply.status).toBe(400)
    }
    const lines = await sql<{ outcome: string, action: string, ip: string }>(app, 'SELECT outcome, action, ip FROM audit_events WHERE id > ? AND patient_id = ?', [before, howard])
    expect(lines).toHaveLength(20)
    expect(new Set(lines.map(l => `${l.action} ${l.outcome}`))).toEqual(new Set(['labs.record refused-invalid']))

    let nora = (await historyOf(patient, howard)).filter(g => g.actor.name === 'Nora Lindqvist')
    expect(nora).toEqual([{ id: expect.any(String), day: clinicToday(), kind: 'refused', count: 20, actions: ['labs.record'], actor: { name: 'Nora Lindqvist', role: 'nurse' }, firstAt: expect.any(String), lastAt: expect.any(String) }])

    const valid = await nurse.post(`/api/patients/${howard}/labs`, { kind: 'psa', takenOn: clinicToday(), value: 0.4 })
    expect(valid.status).toBe(201)
    nora = (await historyOf(patient, howard)).filter(g => g.actor.name === 'Nora Lindqvist')
    expect(nora.map(g => [g.kind, g.count])).toEqual([['change', 1], ['refused', 20]])
    expect((await sql<{ outcome: string }>(app, 'SELECT outcome FROM audit_events WHERE id > ? AND patient_id = ? ORDER BY id DESC LIMIT 1', [before, howard]))[0]!.outcome).toBe('done')
  })

  it('a refusal by the access policy is refused-policy and is not on the patient\'s page', async () => {
    const bernard = ids['LPU-1002']!
    const before = await lastId()
    const stranger = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    expect((await stranger.get(`/api/patients/${bernard}`)).status).toBe(404)
    expect(await sql(app, 'SELECT outcome FROM audit_events WHERE id > ? AND patient_id = ?', [before, bernard])).toEqual([{ outcome: 'refused-policy' }])
    const groups = await historyOf(await Client.signIn(app.url, 'bernard@demo.tidewell.test'), bernard)
    expect(groups.filter(g => g.actor.name === 'Marisol Marwood')).toEqual([])
  })
})

describe('no patient data without its line', () => {
  it('a read whose audit line cannot be written answers 503 without the data; a refused change is still refused', async () => {
    const desmond = ids['LPU-1009']!
    const nurse = await Client.signIn(app.url, 'nurse2@demo.tidewell.test')
    const allowInserts = await refuseInserts(app, 'audit_events')
    try {
      const read = await nurse.get(`/api/patients/${desmond}`)
      expect(read.status).toBe(503)
      expect(JSON.stringify(read.body)).not.toContain('Desmond')
      expect(read.headers.get('retry-after')).toBe('1')
    }
    finally {
      await allowInserts()
    }
    expect((await nurse.get(`/api/patients/${desmond}`)).status).toBe(200)
  })
})

describe('the client address of a server-rendered page', () => {
  it('a staff page of a patient rendered on the server records 127.0.0.1, not a header the browser sent', async () => {
    const cyril = ids['LPU-1008']!
    const nurse = await Client.signIn(app.url, 'nurse2@demo.tidewell.test')
    const before = await lastId()
    const page = await nurse.request('GET', `/staff/patients/${cyril}`, undefined, { 'x-forwarded-for': '203.0.113.9', 'accept': 'text/html' })
    expect(page.status).toBe(200)
    expect(String(page.body)).toContain('Cyril Hathersage')
    const lines = await sql<{ resource: string, ip: string | null, outcome: string }>(app, `SELECT resource, ip, outcome FROM audit_events WHERE id > ? AND patient_id = ? AND actor_user_id = ? AND resource LIKE 'GET /api/patients/%'`, [before, cyril, userIds.nurse2])
    expect(lines.length).toBeGreaterThan(0)
    for (const line of lines) expect(line).toMatchObject({ ip: expect.stringMatching(/127\.0\.0\.1/), outcome: 'done' })
  })
})

describe('list reads name the patients shown', () => {
  it('a queue read writes one line per patient on the page, the roster and the due list one per patient listed', async () => {
    const nurse = await Client.signIn(app.url, 'nurse2@demo.tidewell.test')
    const linesSince = async (id: number, action: string) => (await sql<{ patient_id: number | null, ip: string }>(app, 'SELECT patient_id, ip FROM audit_events WHERE id > ? AND action = ? AND actor_user_id = ?', [id, action, userIds.nurse2]))

    // A result that opens a queue item (the demo starts with an empty queue).
    const clinician = await Client.signIn(app.url, 'clinician@demo.tidewell.test')
    expect((await clinician.post(`/api/patients/${ids['LPU-1002']}/labs`, { kind: 'testosterone', takenOn: clinicToday(), unit: 'ng/dL', value: 80 })).status).toBe(201)
    let before = await lastId()
    const queue = await nurse.get('/api/triage?pageSize=5')
    expect(queue.status).toBe(200)
    const shown = [...new Set((queue.body.items as { patientId: number }[]).map(i => i.patientId))].sort()
    expect(shown.length).toBeGreaterThan(0)
    const queueLines = await linesSince(before, 'triage-queue.read')
    expect(queueLines.map(l => l.patient_id).sort()).toEqual(shown)
    expect(queueLines.every(l => /127\.0\.0\.1/.test(l.ip))).toBe(true)

    before = await lastId()
    const roster = (await nurse.get('/api/patients')).body as { id: number }[]
    expect((await linesSince(before, 'roster.read')).map(l => l.patient_id).sort()).toEqual(roster.map(p => p.id).sort())

    before = await lastId()
    const due = (await nurse.get('/api/due-list')).body as { rows: { patientId: number }[] }
    expect(due.rows.length).toBeGreaterThan(0)
    expect((await linesSince(before, 'due-list.read')).map(l => l.patient_id).sort()).toEqual(due.rows.map(r => r.patientId).sort())

    // The patient sees it in his own words.
    const first = shown[0]!
    const email = (await sql<{ email: string }>(app, 'SELECT u.email FROM users u JOIN patients p ON p.user_id = u.id WHERE p.id = ?', [first]))[0]!.email
    const groups = await historyOf(await Client.signIn(app.url, email), first)
    expect(groups.find(g => g.actor.name === 'Tobias Mwangi' && g.kind === 'read')?.actions).toEqual(expect.arrayContaining(['triage-queue.read', 'roster.read']))
  })
})

describe('the access history groups repeats', () => {
  it('5 reads by one clinician in one day are one line with count 5', async () => {
    const odell = ids['LPU-1004']!
    const clinician = await Client.signIn(app.url, 'clinician@demo.tidewell.test')
    for (let i = 0; i < 5; i++) expect((await clinician.get(`/api/patients/${odell}`)).status).toBe(200)
    const groups = await historyOf(await Client.signIn(app.url, 'odell@demo.tidewell.test'), odell)
    const ines = groups.filter(g => g.actor.name === 'Ines Varga')
    expect(ines.map(g => [g.day, g.kind, g.count, g.actions, g.actor.role])).toEqual([[clinicToday(), 'read', 5, ['patient.read'], 'clinician']])
  })

  it('a line from yesterday in the clinic\'s zone is a group of its own, and pages hold 30 groups', async () => {
    const odell = ids['LPU-1004']!
    // Late yesterday evening in Chicago: already today in UTC for part of the year.
    const lateYesterday = DateTime.now().setZone('America/Chicago').minus({ days: 1 }).set({ hour: 23, minute: 30 }).toUTC()
    const stamp = lateYesterday.toFormat('yyyy-MM-dd HH:mm:ss.SSS') + ' +00:00'
    await sql(app, `INSERT INTO audit_events (actor_user_id, actor_role, patient_id, action, resource, outcome, ip, at) VALUES (?, 'clinician', ?, 'patient.read', 'GET /api/patients/x', 'done', '127.0.0.1', ?)`, [userIds.clinician, odell, stamp])
    const reply = await (await Client.signIn(app.url, 'odell@demo.tidewell.test')).get(`/api/patients/${odell}/access-history`)
    const ines = (reply.body.groups as Group[]).filter(g => g.actor.name === 'Ines Varga')
    expect(ines.map(g => [g.day, g.count])).toEqual([[clinicToday(), 5], [DateTime.now().setZone('America/Chicago').minus({ days: 1 }).toISODate(), 1]])
    expect(reply.body.pageSize).toBe(30)
    expect(reply.body.total).toBe((reply.body.groups as Group[]).length)
    expect(JSON.stringify(reply.body)).not.toMatch(/resource|"ip"|email/)
  })
})
