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

const TABLES = ['users', 'patients', 'care_grants', 'injections', 'appointments', 'diary_entries', 'triage_items', 'triage_events']

async function counts() {
  return Object.fromEntries(await Promise.all(TABLES.map(async t => [t, (await sql<{ n: number }>(app.dbPath, `SELECT COUNT(*) AS n FROM ${t}`))[0]!.n])))
}

describe('the demo clinic', () => {
  it('has the people the README names: 1 admin, 2 nurses, 1 clinician, 12 patients, 2 caregivers', async () => {
    const roles = await sql<{ role: string, n: number }>(app.dbPath, 'SELECT role, COUNT(*) AS n FROM users GROUP BY role ORDER BY role')
    expect(Object.fromEntries(roles.map(r => [r.role, r.n]))).toEqual({ admin: 1, caregiver: 2, clinician: 1, nurse: 2, patient: 12 })
  })

  it('puts work in the triage queue, triaged by the real engine', async () => {
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const queue = (await nurse.get('/api/triage')).body
    const byName = Object.fromEntries(queue.items.filter((i: { source: string }) => i.source === 'diary').map((i: { patientName: string }) => [i.patientName, i]))
    // NICE NG234: back pain that wakes him and is worse on straining -> urgent.
    expect(byName['Odell Pruitt']).toMatchObject({ level: 'urgent', status: 'new' })
    expect(byName['Ramón Espinal Tovar']).toMatchObject({ level: 'urgent', status: 'in-progress', assignee: { name: 'Nora Lindqvist' } })
    // PHQ-2 total >= 3 (Kroenke 2003) -> routine.
    expect(byName['Desmond Laurier']).toMatchObject({ level: 'routine' })
    expect(byName['Cyril Hathersage']).toBeUndefined()
    // The demo's overdue injections are in the queue too, as urgent items.
    const overdue = queue.items.filter((i: { source: string }) => i.source === 'overdue-injection')
    expect(overdue.length).toBeGreaterThan(0)
    expect(overdue.every((i: { level: string }) => i.level === 'urgent')).toBe(true)
    const closed = (await nurse.get('/api/triage?status=closed')).body.items
    expect(closed.find((i: { patientName: string }) => i.patientName === 'Cyril Hathersage')).toMatchObject({ level: 'emergency', disposition: 'sent-to-emergency' })
  })

  it('seeding again on the same database changes nothing', async () => {
    const before = await counts()
    await app.stop({ keepData: true })
    app = await startApp({ dataDir: app.dataDir, env: { NUXT_SEED_DEMO_ACTIVITY: 'true' } })
    expect(await counts()).toEqual(before)
  })
})
