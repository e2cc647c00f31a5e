import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { Client, DEMO_PASSWORD } from '../support/client'
import type { Reply } from '../support/client'
import type { LoadPatient } from '../support/load'
import { diaryWithNote, signInLoadPatients, startAppWithPatients } from '../support/load'
import type { Database } from '../support/sqlite'
import { onPostgres } from '../support/postgres'
import { sql } from '../support/sqlite'

/*
 * The write path under load (issue 10): every write waits its turn in one bounded line
 * (server/utils/core/write-queue.ts) instead of in SQLite's busy handler. Nothing here times
 * anything; the bench measures speed.
 */

const PATIENTS = 50
let app: RunningApp
let patients: LoadPatient[]

beforeAll(async () => {
  app = await startAppWithPatients(PATIENTS)
  patients = await signInLoadPatients(app, PATIENTS)
}, 120_000)

afterAll(async () => {
  await app?.stop()
})

const entriesOf = async (db: Database, patientIds: number[]) =>
  sql<{ patientId: number, id: number, items: number }>(db,
    `SELECT d.patient_id AS "patientId", d.id AS id, (SELECT COUNT(*) FROM triage_items t WHERE t.diary_entry_id = d.id) AS items
     FROM diary_entries d WHERE d.patient_id IN (${patientIds.map(() => '?').join(',')}) ORDER BY d.id`, patientIds)

describe('many writers at once', () => {
  it('50 patients send their diaries at the same moment: all 50 acknowledged and stored once, and the nurse\'s queue answers meanwhile', async () => {
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const sends = patients.map((p, n) => p.client.post(`/api/patients/${p.patientId}/diary`, diaryWithNote(n)))
    const queue = nurse.get('/api/triage')
    const replies = await Promise.all(sends)
    const read = await queue

    expect(replies.map(r => r.status), JSON.stringify(replies.find(r => r.status !== 201)?.body)).toEqual(Array(PATIENTS).fill(201))
    expect(read.status).toBe(200)
    expect(Array.isArray(read.body.items)).toBe(true)
    const stored = await entriesOf(app, patients.map(p => p.patientId))
    expect(stored).toHaveLength(PATIENTS)
    expect(new Set(stored.map(e => e.patientId)).size).toBe(PATIENTS)
    expect(stored.map(e => e.id).sort((a, b) => a - b)).toEqual(replies.map(r => r.body.id as number).sort((a, b) => a - b))
    // Each note opens exactly one routine queue item (rule note-to-read).
    expect(stored.every(e => e.items === 1)).toBe(true)
  }, 120_000)

  it('two nurses closing one item at the same moment: one 200, one 409', async () => {
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const nurse2 = await Client.signIn(app.url, 'nurse2@demo.tidewell.test')
    const [entry] = await entriesOf(app, [patients[0]!.patientId])
    const [item] = await sql<{ id: number }>(app, 'SELECT id FROM triage_items WHERE diary_entry_id = ?', [entry!.id])
    expect((await nurse.post(`/api/triage/${item!.id}/events`, { type: 'disposition', disposition: 'self-care' })).status).toBe(200)

    const replies = await Promise.all([nurse, nurse2].map(n => n.post(`/api/triage/${item!.id}/events`, { type: 'close' })))
    expect(replies.map(r => r.status).sort()).toEqual([200, 409])
    expect(replies.find(r => r.status === 409)!.body.message).toBe('errors.triageClosed')
    const closed = await sql<{ n: number }>(app, `SELECT COUNT(*) AS n FROM triage_events WHERE item_id = ? AND type = 'closed'`, [item!.id])
    expect(closed[0]!.n).toBe(1)
  }, 60_000)

  it('20 wrong passwords sent at once for one account count exactly the limit and lock it', async () => {
    const email = `load-${PATIENTS}@demo.tidewell.test`
    const before = (await sql<{ n: number }>(app, 'SELECT COUNT(*) AS n FROM sign_in_failures'))[0]!.n
    const replies = await Promise.all(Array.from({ length: 20 }, () => new Client(app.url).post('/api/auth/sign-in', { email, password: 'not the password' })))
    const statuses = replies.map(r => r.status)
    // Five failures lock an account (server/utils/auth/sign-in-limit.ts MAX_FAILURES, common practice).
    expect(statuses.filter(s => s === 401)).toHaveLength(5)
    expect(statuses.filter(s => s === 429)).toHaveLength(15)
    const after = (await sql<{ n: number }>(app, 'SELECT COUNT(*) AS n FROM sign_in_failures'))[0]!.n
    expect(after - before).toBe(5)
    // Locked: even the right password is refused now.
    const right = await new Client(app.url).post('/api/auth/sign-in', { email, password: DEMO_PASSWORD })
    expect(right.status).toBe(429)
    expect(Number(right.headers.get('retry-after'))).toBeGreaterThan(0)
  }, 60_000)
})

describe('a full write line', () => {
  let tiny: RunningApp
  let tinyPatients: LoadPatient[]

  beforeAll(async () => {
    // One write may wait behind the running one; every other is refused at once. On
    // PostgreSQL (no line in the process) the transaction gate of server/utils/core/db.ts
    // stands in: a pool of two leaves one transaction at a time, and one that cannot start
    // within 50 ms is refused the same way, before it writes anything.
    tiny = await startAppWithPatients(30, onPostgres ? { NUXT_DATABASE_POOL_MAX: '2', NUXT_WRITE_QUEUE_WAIT_MS: '50' } : { NUXT_WRITE_QUEUE_MAX: '1' })
    tinyPatients = await signInLoadPatients(tiny, 30, 1)
  }, 120_000)

  afterAll(async () => {
    await tiny?.stop()
  })

  it('answers 503 with Retry-After at once, never a 500, and stores nothing of a refused diary', async () => {
    const replies: Reply[] = await Promise.all(tinyPatients.map((p, n) => p.client.post(`/api/patients/${p.patientId}/diary`, diaryWithNote(n))))
    const statuses = replies.map(r => r.status)
    expect(statuses.every(s => s === 201 || s === 503), JSON.stringify(statuses)).toBe(true)
    const refused = replies.filter(r => r.status === 503)
    expect(refused.length).toBeGreaterThan(0)
    for (const reply of refused) {
      expect(reply.body.message).toBe('errors.busy')
      expect(Number(reply.headers.get('retry-after'))).toBeGreaterThanOrEqual(1)
    }

    const stored = await entriesOf(tiny, tinyPatients.map(p => p.patientId))
    const acknowledged = tinyPatients.filter((_, n) => statuses[n] === 201).map(p => p.patientId)
    expect(stored.map(e => e.patientId).sort((a, b) => a - b)).toEqual(acknowledged.sort((a, b) => a - b))
    expect(stored.every(e => e.items === 1)).toBe(true)
    // Nothing else of a refused diary: no queue item, no alert e-mail in the outbox for it.
    const items = await sql<{ n: number }>(tiny, `SELECT COUNT(*) AS n FROM triage_items WHERE patient_id IN (${tinyPatients.map(p => p.patientId).join(',')})`)
    expect(items[0]!.n).toBe(acknowledged.length)

    // Once the line is clear, a refused patient's retry is stored.
    const again = tinyPatients[statuses.indexOf(503)]!
    const retry = await again.client.post(`/api/patients/${again.patientId}/diary`, diaryWithNote(99))
    expect(retry.status).toBe(201)
  }, 120_000)
})
