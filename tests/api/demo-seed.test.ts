import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { sql } from '../support/sqlite'

let app: RunningApp
beforeAll(async () => {
  app = await startApp({ env: { NUXT_SEED_DEMO_ACTIVITY: 'true' } })
})
afterAll(() => app?.stop())

const TABLES = ['users', 'patients', 'care_grants', 'injections', 'appointments', 'diary_entries', 'triage_items', 'triage_events', 'monitoring_plans', 'monitoring_items', 'message_threads', 'messages', 'message_reads']

async function counts() {
  return Object.fromEntries(await Promise.all(TABLES.map(async t => [t, (await sql<{ n: number }>(app, `SELECT COUNT(*) AS n FROM ${t}`))[0]!.n])))
}

describe('the demo clinic', () => {
  it('has the people the README names: 1 admin, 2 nurses, 1 clinician, 12 patients, 2 caregivers', async () => {
    const roles = await sql<{ role: string, n: number }>(app, 'SELECT role, COUNT(*) AS n FROM users GROUP BY role ORDER BY role')
    expect(Object.fromEntries(roles.map(r => [r.role, r.n]))).toEqual({ admin: 1, caregiver: 2, clinician: 1, nurse: 2, patient: 12 })
  })

  it('puts work in the triage queue, triaged by the real engine', async () => {
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const queue = (await nurse.get('/api/triage')).body
    // The queue lists the highest level first; a patient's first row is his most pressing item.
    const byName = Object.fromEntries(queue.items.filter((i: { source: string }) => i.source === 'diary').reverse().map((i: { patientName: string }) => [i.patientName, i]))
    // NICE NG234: back pain that wakes him and is worse on straining -> urgent.
    expect(byName['Odell Pruitt']).toMatchObject({ level: 'urgent', status: 'new' })
    expect(byName['Ramón Espinal Tovar']).toMatchObject({ level: 'urgent', status: 'in-progress', assignee: { name: 'Nora Lindqvist' } })
    // PHQ-2 total >= 3 (Kroenke 2003) -> routine, one step higher for a total up from 2 to 4
    // since his last report (Basch 2016, worsening of 2 points; rules version 3) -> urgent.
    expect(byName['Desmond Laurier']).toMatchObject({ level: 'urgent' })
    expect(byName['Desmond Laurier'].reasons.map((r: { rule: string }) => r.rule)).toContain('phq2-positive')
    expect(byName['Cyril Hathersage']).toBeUndefined()
    // The demo's overdue injections are in the queue too, as urgent items.
    const overdue = queue.items.filter((i: { source: string }) => i.source === 'overdue-injection')
    expect(overdue.length).toBeGreaterThan(0)
    expect(overdue.every((i: { level: string }) => i.level === 'urgent')).toBe(true)
    const closed = (await nurse.get('/api/triage?status=closed')).body.items
    expect(closed.find((i: { patientName: string }) => i.patientName === 'Cyril Hathersage')).toMatchObject({ level: 'emergency', disposition: 'sent-to-emergency' })
  })

  it('gives every patient and caregiver a phone in the fictional 555-0100 to 555-0199 range, and three patients a risk profile', async () => {
    const patients = await sql<{ phones: string, best_times_to_call: string, risk_profile: string | null }>(app, 'SELECT phones, best_times_to_call, risk_profile FROM patients')
    expect(patients).toHaveLength(12)
    for (const patient of patients) {
      const phones = JSON.parse(patient.phones) as { number: string }[]
      expect(phones.length).toBeGreaterThan(0)
      for (const phone of phones) expect(phone.number).toMatch(/^\(\d{3}\) 555-01\d{2}$/)
      expect(patient.best_times_to_call).not.toBe('')
    }
    expect(patients.filter(p => p.risk_profile && Object.values(JSON.parse(p.risk_profile)).includes(true))).toHaveLength(3)
    const caregivers = await sql<{ phone: string | null }>(app, `SELECT phone FROM users WHERE role = 'caregiver'`)
    for (const caregiver of caregivers) expect(caregiver.phone).toMatch(/^\(\d{3}\) 555-01\d{2}$/)
  })

  it('gives every patient a monitoring plan owned by the clinician; ECG and electrolytes only for the man with heart risk factors', async () => {
    const plans = await sql<{ clinic_number: string, owner: string, items: number }>(app, `SELECT p.clinic_number, u.email AS owner, (SELECT COUNT(*) FROM monitoring_items i WHERE i.plan_id = m.id) AS items
      FROM monitoring_plans m JOIN patients p ON p.id = m.patient_id JOIN users u ON u.id = m.owner_user_id`)
    expect(plans).toHaveLength(12)
    for (const plan of plans) expect(plan).toMatchObject({ owner: 'clinician@demo.tidewell.test', items: 10 })
    const ecg = await sql<{ clinic_number: string }>(app, `SELECT p.clinic_number FROM monitoring_items i JOIN patients p ON p.id = i.patient_id WHERE i.kind = 'ecg' AND i.active = true`)
    expect(ecg.map(row => row.clinic_number)).toEqual(['LPU-1010'])
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const due = (await nurse.get('/api/monitoring/due')).body.rows as { state: string }[]
    // LPU-1008's bone scan was 800 days ago (every 730 days); "due this month" depends on the day the demo is seeded.
    expect(due.some(row => row.state === 'overdue')).toBe(true)
    expect(due.every(row => row.state === 'overdue' || row.state === 'due-this-month')).toBe(true)
  })

  it('has a few invented conversations, with nothing new for the triage queue', async () => {
    const patient = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const { body } = await patient.get('/api/me/patients')
    const view = (await patient.get(`/api/patients/${body[0].patientId}/messages`)).body
    type Thread = { subject: string, messages: { author: { name: string, relation: string, onBehalf: boolean } }[] }
    const thread = (subject: string) => (view.threads as Thread[]).find(t => t.subject === subject)!
    expect(thread('Hot flushes at night')).toMatchObject({ unread: 0 })
    expect(thread('Hot flushes at night').messages.map(m => m.author.relation)).toEqual(['self', 'staff', 'self'])
    // Marisol, the demo caregiver allowed to message, asked one question on his behalf.
    expect(thread('Lift to the next appointment').messages[0]!.author).toMatchObject({ name: 'Marisol Marwood', relation: 'caregiver', onBehalf: true })
    const marisol = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    expect((await marisol.get('/api/me/patients')).body[0]).toMatchObject({ canMessage: true })
    expect((await marisol.get('/api/me/unread')).body.unread).toBe(0)
    const kenji = await Client.signIn(app.url, 'kenji@demo.tidewell.test')
    expect((await kenji.get('/api/me/unread')).body.unread).toBe(1)
    expect((await sql<{ n: number }>(app, 'SELECT COUNT(*) AS n FROM messages'))[0]!.n).toBe(8)
    expect((await sql<{ n: number }>(app, 'SELECT COUNT(*) AS n FROM triage_items WHERE source = \'message\''))[0]!.n).toBe(0)
  })

  it('seeding again on the same database changes nothing', async () => {
    const before = await counts()
    await app.stop({ keepData: true })
    app = await startApp({ dataDir: app.dataDir, env: { NUXT_SEED_DEMO_ACTIVITY: 'true' } })
    expect(await counts()).toEqual(before)
  })
})
