import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { MailCatcher } from '../support/mail-catcher'
import { sql } from '../support/sqlite'

/*
 * The monitoring plan through the built server. Every expected date is counted by hand from
 * the intervals in shared/monitoring/rules.ts (the counting is beside it): PSA every 84 days
 * on the 1-month depot (28-day cycles) and every 168 days on the 6-month depot; bone density
 * every 730 days. A check never done on a plan made after its first-due date is due today.
 */

let app: RunningApp
let mail: MailCatcher
let nurse: Client
let clinician: Client
let admin: Client
let patientId: number
let clinicianId: number
let today: string
const regimenIds: Record<string, number> = {}

interface ItemView { kind: string, intervalDays: number, firstDueOn: string, lastDoneOn: string | null, active: boolean, note: string | null, dueOn: string | null, state: string | null, lastResult: { level: string } | null }
const item = (view: { plan: { items: ItemView[] } }, kind: string) => view.plan.items.find(i => i.kind === kind)!
const plan = async () => (await nurse.get(`/api/patients/${patientId}/monitoring`)).body
const injection = (date: string, regimenId: number) => ({ date, time: '09:00', site: 'gluteal-left', lotNumber: 'LQ7001A', lotExpiresOn: '2027-12-01', regimenId })

beforeAll(async () => {
  mail = await MailCatcher.start()
  app = await startApp({ smtpUrl: mail.url })
  nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
  clinician = await Client.signIn(app.url, 'clinician@demo.tidewell.test')
  admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
  for (const regimen of (await nurse.get('/api/regimens')).body as { id: number, name: string }[]) regimenIds[regimen.name] = regimen.id
  clinicianId = (await sql<{ id: number }>(app, `SELECT id FROM users WHERE email = 'clinician@demo.tidewell.test'`))[0]!.id
  // A man new to the clinic (invented), who reads Spanish: on the 1-month depot from 2026-01-05.
  const created = await admin.post('/api/users', { email: 'teodoro@demo.tidewell.test', name: 'Teodoro Alcañiz Brun', role: 'patient', language: 'es', patient: { clinicNumber: 'LPU-3001', dateOfBirth: '1950-07-07' } })
  expect(created.status, JSON.stringify(created.body)).toBe(201)
  patientId = (await sql<{ id: number }>(app, `SELECT id FROM patients WHERE clinic_number = 'LPU-3001'`))[0]!.id
  expect((await nurse.put(`/api/patients/${patientId}/regimen`, { regimenId: regimenIds['1-month depot'], startsOn: '2026-01-05' })).status).toBe(200)
  expect((await nurse.post(`/api/patients/${patientId}/injections`, injection('2026-01-05', regimenIds['1-month depot']!))).status).toBe(201)
  today = (await nurse.get(`/api/patients/${patientId}/labs`)).body.today
})
afterAll(async () => {
  await app?.stop()
  await mail?.stop()
})

describe('making the plan from the clinic defaults', () => {
  it('before a plan is made, nurses read that there is none; a nurse may not make one (clinicians own it)', async () => {
    const view = await plan()
    expect(view).toMatchObject({ plan: null, regimenName: '1-month depot', can: { manage: false, markDone: true } })
    expect((await nurse.post(`/api/patients/${patientId}/monitoring/defaults`, { ownerUserId: clinicianId })).status).toBe(403)
  })

  it('the owner must be an active clinician', async () => {
    const nurseId = (await sql<{ id: number }>(app, `SELECT id FROM users WHERE email = 'nurse@demo.tidewell.test'`))[0]!.id
    const reply = await clinician.post(`/api/patients/${patientId}/monitoring/defaults`, { ownerUserId: nurseId })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors.ownerUserId).toEqual(['validation.monitoring.ownerRequired'])
  })

  it('a clinician makes it (201): every check, intervals for 28-day cycles, ECG and electrolytes inactive without QT risk factors', async () => {
    const reply = await clinician.post(`/api/patients/${patientId}/monitoring/defaults`, { ownerUserId: clinicianId })
    expect(reply.status, JSON.stringify(reply.body)).toBe(201)
    expect(reply.body.plan).toMatchObject({ owner: { id: clinicianId, name: 'Ines Varga' }, regimenName: '1-month depot', regimenChanged: false })
    expect(reply.body.plan.items).toHaveLength(10)
    // PSA 84 = 3 cycles; testosterone and HbA1c 168 = 6 cycles; lipids 365 -> 13 cycles = 364; BP every visit; bone 730.
    expect(Object.fromEntries(reply.body.plan.items.map((i: ItemView) => [i.kind, i.intervalDays]))).toEqual({
      'testosterone': 168, 'psa': 84, 'glucose': 168, 'ecg': 168, 'electrolytes': 168, 'lipids': 364, 'bone-density': 730, 'vitamin-d': 364, 'blood-pressure': 28, 'weight': 28,
    })
    expect(item(reply.body, 'ecg')).toMatchObject({ active: false, dueOn: null, state: null })
    // Every first-due date from 2026-01-05 has passed: a check never done is due today.
    expect(item(reply.body, 'psa')).toMatchObject({ firstDueOn: today, lastDoneOn: null, dueOn: today, state: 'due-this-month' })
  })
})

describe('a result fulfils its check', () => {
  it('a PSA taken 2026-03-30 makes the PSA due 84 days on, 2026-06-22 (1 to Mar 31, 30 in April, 31 in May, 22 into June)', async () => {
    expect((await nurse.post(`/api/patients/${patientId}/labs`, { kind: 'psa', takenOn: '2026-03-30', value: '0.8' })).status).toBe(201)
    expect(item(await plan(), 'psa')).toMatchObject({ lastDoneOn: '2026-03-30', dueOn: '2026-06-22', state: 'overdue' })
  })

  it('an older PSA entered later does not move it back', async () => {
    expect((await nurse.post(`/api/patients/${patientId}/labs`, { kind: 'psa', takenOn: '2026-02-02', value: '1.5' })).status).toBe(201)
    expect(item(await plan(), 'psa')).toMatchObject({ lastDoneOn: '2026-03-30', dueOn: '2026-06-22' })
  })

  it('an out-of-range result still opens a queue item (lab rules) and shows in the plan with its level', async () => {
    // 80 ng/dL on therapy (more than 28 days after his first injection) is not castrate (Oefelein 2000).
    const reply = await nurse.post(`/api/patients/${patientId}/labs`, { kind: 'testosterone', takenOn: '2026-04-01', unit: 'ng/dL', value: 80 })
    expect(reply.body.level).toBe('urgent')
    expect(await sql(app, 'SELECT id FROM triage_items WHERE source_key = ?', [`lab:${reply.body.id}`])).toHaveLength(1)
    // Done 2026-04-01, every 168 days: 29 to Apr 30, 31 May (60), 30 Jun (90), 31 Jul (121), 31 Aug (152), 16 into Sept (168).
    expect(item(await plan(), 'testosterone')).toMatchObject({ lastDoneOn: '2026-04-01', dueOn: '2026-09-16', lastResult: { level: 'urgent' } })
  })

  it('a nurse marks a bone scan done on 2026-02-10: next due 730 days on, 2028-02-10 (365 to 2027-02-10, 365 more)', async () => {
    const reply = await nurse.post(`/api/patients/${patientId}/monitoring/done`, { kind: 'bone-density', doneOn: '2026-02-10', note: 'Scan at the hospital' })
    expect(reply.status, JSON.stringify(reply.body)).toBe(200)
    expect(item(reply.body, 'bone-density')).toMatchObject({ lastDoneOn: '2026-02-10', dueOn: '2028-02-10', state: 'later', note: 'Scan at the hospital' })
  })

  it('a date in the future is refused', async () => {
    const reply = await nurse.post(`/api/patients/${patientId}/monitoring/done`, { kind: 'weight', doneOn: '2999-01-01' })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors.doneOn).toEqual(['validation.monitoring.futureDate'])
  })
})

describe('across a regimen change', () => {
  it('on the 6-month depot from 2026-04-27 the plan says so; applied again (200), PSA every 168 days: 2026-03-30 + 168 = 2026-09-14', async () => {
    expect((await nurse.put(`/api/patients/${patientId}/regimen`, { regimenId: regimenIds['6-month depot'], startsOn: '2026-04-27' })).status).toBe(200)
    expect((await nurse.post(`/api/patients/${patientId}/injections`, injection('2026-04-27', regimenIds['6-month depot']!))).status).toBe(201)
    const changed = await plan()
    expect(changed.plan).toMatchObject({ regimenName: '1-month depot', regimenChanged: true })
    expect(item(changed, 'psa')).toMatchObject({ intervalDays: 84, dueOn: '2026-06-22' })

    const reply = await clinician.post(`/api/patients/${patientId}/monitoring/defaults`, { ownerUserId: clinicianId })
    expect(reply.status).toBe(200)
    expect(reply.body.plan).toMatchObject({ regimenName: '6-month depot', regimenChanged: false })
    // 84 days to 2026-06-22, 8 to Jun 30, 31 in July, 31 in August, 14 into September.
    expect(item(reply.body, 'psa')).toMatchObject({ intervalDays: 168, lastDoneOn: '2026-03-30', dueOn: '2026-09-14' })
    // Testosterone 168 on 168-day cycles; lipids 365 -> 2 cycles = 336; the bone scan keeps its date and note.
    expect(item(reply.body, 'testosterone')).toMatchObject({ intervalDays: 168, dueOn: '2026-09-16' })
    expect(item(reply.body, 'lipids').intervalDays).toBe(336)
    expect(item(reply.body, 'bone-density')).toMatchObject({ lastDoneOn: '2026-02-10', note: 'Scan at the hospital', dueOn: '2028-02-10' })
  })
})

describe('the clinician changes the plan', () => {
  it('PUT sets intervals, switches an item on or off and keeps the last-done dates; a kind twice is refused', async () => {
    const current = await plan()
    const items = current.plan.items.map((i: ItemView) => ({ kind: i.kind, intervalDays: i.kind === 'psa' ? '112' : i.intervalDays, firstDueOn: i.firstDueOn, active: i.kind === 'ecg' ? true : i.active, note: i.note }))
    expect((await nurse.put(`/api/patients/${patientId}/monitoring`, { ownerUserId: clinicianId, items })).status).toBe(403)
    const twice = await clinician.put(`/api/patients/${patientId}/monitoring`, { ownerUserId: clinicianId, items: [...items, items[0]] })
    expect(twice.status).toBe(400)
    const reply = await clinician.put(`/api/patients/${patientId}/monitoring`, { ownerUserId: clinicianId, items })
    expect(reply.status, JSON.stringify(reply.body)).toBe(200)
    // 2026-03-30 + 112: 1 to Mar 31, 30 Apr (31), 31 May (62), 30 Jun (92), 20 into July (112).
    expect(item(reply.body, 'psa')).toMatchObject({ intervalDays: 112, lastDoneOn: '2026-03-30', dueOn: '2026-07-20' })
    expect(item(reply.body, 'ecg')).toMatchObject({ active: true, dueOn: today })
  })
})

describe('who reads what is due', () => {
  it('the clinic-wide list (nurses and clinicians) has his overdue checks, one audit line per patient shown; admins may not open it', async () => {
    const reply = await nurse.get('/api/monitoring/due')
    expect(reply.status).toBe(200)
    const his = reply.body.rows.filter((row: { patientId: number }) => row.patientId === patientId)
    expect(his.find((row: { kind: string }) => row.kind === 'psa')).toMatchObject({ dueOn: '2026-07-20', state: 'overdue', clinicNumber: 'LPU-3001', lastDoneOn: '2026-03-30' })
    expect(his.find((row: { kind: string }) => row.kind === 'bone-density')).toBeUndefined()
    const lines = await sql<{ patient_id: number }>(app, `SELECT patient_id FROM audit_events WHERE action = 'monitoring-due.read'`)
    expect(lines.map(l => l.patient_id)).toContain(patientId)
    expect((await admin.get('/api/monitoring/due')).status).toBe(403)
  })

  it('reading his plan is in the audit trail', async () => {
    const lines = await sql(app, `SELECT id FROM audit_events WHERE action = 'monitoring.read' AND patient_id = ? AND outcome = 'done'`, [patientId])
    expect(lines.length).toBeGreaterThan(0)
  })

  it('a demo patient reads his own checks in plain words, with no values, intervals or notes', async () => {
    const elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const id = (await sql<{ id: number }>(app, `SELECT id FROM patients WHERE clinic_number = 'LPU-1001'`))[0]!.id
    const reply = await elias.get(`/api/patients/${id}/monitoring/due`)
    expect(reply.status).toBe(200)
    expect(reply.body.items.length).toBeGreaterThan(0)
    for (const row of reply.body.items) expect(Object.keys(row).sort()).toEqual(['dueOn', 'kind', 'state'])
    expect((await elias.get(`/api/patients/${id}/monitoring`)).status).toBe(403)
  })
})

describe('the reminder e-mail', () => {
  it('he is reminded in Spanish that a planned check is due, with no test, date or value in it, once', async () => {
    const run = async () => (await admin.post('/api/admin/tasks/schedule:reminders', {})).body.result
    expect((await run()).monitoring).toBeGreaterThan(0)
    const message = await mail.waitFor(m => m.to.includes('teodoro@demo.tidewell.test') && m.subject === 'Le toca un control de su clínica', 20_000)
    expect(message.text).toContain('Larkspur Point Urology')
    for (const word of ['PSA', 'testosterona', 'Testosterona', 'densitometría', 'ECG', '2026', 'ng/']) expect(message.text, word).not.toContain(word)
    await run()
    await new Promise(resolve => setTimeout(resolve, 1500))
    expect(mail.messages.filter(m => m.to.includes('teodoro@demo.tidewell.test') && m.subject === 'Le toca un control de su clínica')).toHaveLength(1)
  })
})
