import { parse } from 'csv-parse/sync'
import { DateTime } from 'luxon'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { addCaregiver, patientIds } from '../support/circle'
import { Client } from '../support/client'
import { MailCatcher } from '../support/mail-catcher'

let app: RunningApp
let mail: MailCatcher
let admin: Client
let howard: number
let userIds: Record<string, number>

beforeAll(async () => {
  mail = await MailCatcher.start()
  app = await startApp({ smtpUrl: mail.url })
  howard = (await patientIds(app.url))['LPU-1011']!
  admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
  const users = (await admin.get('/api/users')).body as { id: number, email: string }[]
  userIds = Object.fromEntries(users.map(u => [u.email.split('@')[0], u.id]))

  // Known events on Howard's record: the roster read of patientIds() (nurse2, one line per
  // patient listed), two reads by the clinician, one by a nurse, one refused caregiver.
  const clinician = await Client.signIn(app.url, 'clinician@demo.tidewell.test')
  await clinician.get(`/api/patients/${howard}`)
  await clinician.get(`/api/patients/${howard}/schedule`)
  await (await Client.signIn(app.url, 'nurse@demo.tidewell.test')).get(`/api/patients/${howard}`)
  expect((await (await Client.signIn(app.url, 'dana@demo.tidewell.test')).get(`/api/patients/${howard}`)).status).toBe(404)
})
afterAll(async () => {
  await app?.stop()
  await mail?.stop()
})

const query = (params: Record<string, string | number>) => new URLSearchParams(Object.entries(params).map(([k, v]) => [k, String(v)])).toString()

describe('GET /api/audit', () => {
  it('is for admins only', async () => {
    for (const email of ['nurse@demo.tidewell.test', 'clinician@demo.tidewell.test', 'patient@demo.tidewell.test', 'caregiver@demo.tidewell.test']) {
      const someone = await Client.signIn(app.url, email)
      expect((await someone.get('/api/audit')).status, email).toBe(403)
      expect((await someone.get('/api/audit/export')).status, email).toBe(403)
    }
  })

  it('filters by patient, person, action and outcome', async () => {
    const byPatient = (await admin.get(`/api/audit?${query({ patient: howard })}`)).body
    expect(byPatient.total).toBe(5)
    expect(byPatient.events.map((e: { actor: { name: string }, action: string, outcome: string, resource: string }) => [e.actor.name, e.action, e.outcome, e.resource])).toEqual([
      ['Dana Achterberg', 'patient.read', 'refused-policy', `GET /api/patients/${howard}`],
      ['Nora Lindqvist', 'patient.read', 'done', `GET /api/patients/${howard}`],
      ['Ines Varga', 'patient.read', 'done', `GET /api/patients/${howard}/schedule`],
      ['Ines Varga', 'patient.read', 'done', `GET /api/patients/${howard}`],
      ['Tobias Mwangi', 'roster.read', 'done', 'GET /api/patients'],
    ])
    expect(byPatient.events[0]).toMatchObject({ actorRole: 'caregiver', patient: { id: howard, name: 'Howard Tillinghast', clinicNumber: 'LPU-1011' } })
    expect(byPatient.actions).toEqual(expect.arrayContaining(['patient.read', 'roster.read']))

    expect((await admin.get(`/api/audit?${query({ patient: howard, actor: userIds.clinician! })}`)).body.total).toBe(2)
    expect((await admin.get(`/api/audit?${query({ patient: howard, outcome: 'refused-policy' })}`)).body.total).toBe(1)
    expect((await admin.get(`/api/audit?${query({ patient: howard, action: 'circle.read' })}`)).body.total).toBe(0)
    const reads = (await admin.get(`/api/audit?${query({ actor: userIds.admin!, action: 'audit.read' })}`)).body
    expect(reads.total).toBeGreaterThanOrEqual(4)
    expect(reads.events[0].patient).toBeNull()
  })

  it('filters by a date range counted in whole days of the clinic\'s time zone (America/Chicago)', async () => {
    const today = DateTime.now().setZone('America/Chicago').toISODate()!
    const yesterday = DateTime.now().setZone('America/Chicago').minus({ days: 1 }).toISODate()!
    expect((await admin.get(`/api/audit?${query({ patient: howard, from: today, to: today })}`)).body.total).toBe(5)
    expect((await admin.get(`/api/audit?${query({ patient: howard, from: yesterday, to: yesterday })}`)).body.total).toBe(0)
    expect((await admin.get(`/api/audit?${query({ patient: howard, to: yesterday })}`)).body.total).toBe(0)
    expect((await admin.get(`/api/audit?${query({ patient: howard, from: yesterday })}`)).body.total).toBe(5)
    const backwards = await admin.get(`/api/audit?${query({ from: today, to: yesterday })}`)
    expect(backwards.status).toBe(400)
    expect(backwards.body.data.fieldErrors.to).toEqual(['validation.audit.toBeforeFrom'])
    expect((await admin.get('/api/audit?from=2025-02-30')).status).toBe(400)
    expect((await admin.get('/api/audit?nonsense=1')).status).toBe(400)
  })

  it('pages fifty lines at a time, newest first', async () => {
    const bernard = (await patientIds(app.url))['LPU-1002']!
    const nurse = await Client.signIn(app.url, 'nurse2@demo.tidewell.test')
    for (let i = 0; i < 55; i++) await nurse.get(`/api/patients/${bernard}`)
    const first = (await admin.get(`/api/audit?${query({ patient: bernard, action: 'patient.read' })}`)).body
    const second = (await admin.get(`/api/audit?${query({ patient: bernard, action: 'patient.read', page: 2 })}`)).body
    expect([first.total, first.pageSize, first.events.length, second.events.length]).toEqual([55, 50, 50, 5])
    const ids = [...first.events, ...second.events].map((e: { id: number }) => e.id)
    expect(ids).toEqual([...ids].sort((a, b) => b - a))
  })
})

describe('GET /api/audit/export', () => {
  it('opens with a general-purpose CSV parser (csv-parse) and has one row per event', async () => {
    const reply = await admin.get(`/api/audit/export?${query({ patient: howard, action: 'patient.read' })}`)
    expect(reply.status).toBe(200)
    expect(reply.headers.get('content-type')).toMatch(/^text\/csv/)
    expect(reply.headers.get('content-disposition')).toMatch(/^attachment; filename="tidewell-audit-trail-\d{4}-\d{2}-\d{2}\.csv"$/)
    const rows = parse(reply.body as string, { columns: true, skip_empty_lines: true }) as Record<string, string>[]
    expect(rows).toHaveLength(4)
    expect(Object.keys(rows[0]!)).toEqual(['id', 'at', 'actor_user_id', 'actor_name', 'actor_email', 'actor_role', 'patient_id', 'patient_clinic_number', 'patient_name', 'action', 'resource', 'outcome', 'ip'])
    expect(rows.map(r => [r.actor_name, r.actor_role, r.patient_clinic_number, r.action, r.outcome])).toEqual([
      ['Dana Achterberg', 'caregiver', 'LPU-1011', 'patient.read', 'refused-policy'],
      ['Nora Lindqvist', 'nurse', 'LPU-1011', 'patient.read', 'done'],
      ['Ines Varga', 'clinician', 'LPU-1011', 'patient.read', 'done'],
      ['Ines Varga', 'clinician', 'LPU-1011', 'patient.read', 'done'],
    ])
    expect(rows.every(r => !Number.isNaN(Date.parse(r.at!)) && r.ip!.includes('127.0.0.1'))).toBe(true)
  })

  it('the whole trail: as many rows as the page counted, plus the page\'s own line', async () => {
    const page = (await admin.get('/api/audit')).body
    const rows = parse((await admin.get('/api/audit/export')).body as string, { columns: true }) as Record<string, string>[]
    expect(rows).toHaveLength(page.total + 1)
    expect(rows[0]).toMatchObject({ action: 'audit.read', actor_email: 'admin@demo.tidewell.test', patient_id: '' })
    expect(new Set(rows.map(r => r.id)).size).toBe(rows.length)
    const exports = (await admin.get(`/api/audit?${query({ action: 'audit.export' })}`)).body
    expect(exports.total).toBe(2)
  })

  it('a name that a spreadsheet would run as a formula is written as text', async () => {
    const howardClient = await Client.signIn(app.url, 'howard@demo.tidewell.test')
    await addCaregiver(app.url, mail, howardClient, howard, { name: '=SUM(1+2) Helper', email: 'formula@demo.tidewell.test' })
    const rows = parse((await admin.get(`/api/audit/export?${query({ patient: howard, action: 'circle.accept' })}`)).body as string, { columns: true }) as Record<string, string>[]
    expect(rows.map(r => r.actor_name)).toEqual(['\'=SUM(1+2) Helper'])
  })
})

describe('a long address', () => {
  it('is kept whole in the audit line and the read still answers (PostgreSQL enforces column lengths, SQLite does not)', async () => {
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    // A query string the route ignores, long enough to pass 255 characters.
    const padding = 'x'.repeat(400)
    const path = `/api/patients/${howard}/schedule?note=${padding}`
    const reply = await nurse.get(path)
    expect(reply.status).toBe(200)
    const lines = (await admin.get(`/api/audit?${query({ patient: howard })}`)).body.events as { resource: string }[]
    expect(lines.map(line => line.resource)).toContain(`GET ${path}`)
  })
})
