import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import type { Reply } from '../support/client'
import { Client, DEMO_PASSWORD } from '../support/client'
import type { LoadPatient } from '../support/load'
import { addLoadPatients, diaryWithNote, signInLoadPatients } from '../support/load'
import { MailCatcher } from '../support/mail-catcher'
import { createDatabase, onPostgres } from '../support/postgres'
import { sql } from '../support/sqlite'

/*
 * Issue 14: two app instances on one PostgreSQL database, as behind a load balancer. They
 * share the database, the session password (startApp gives every server the same one) and
 * the SMTP server; each has its own port, data folder and outbox worker.
 */

const REASON = 'two app instances share one database only on PostgreSQL (run with TIDEWELL_DB=postgres; npm test does in its second pass)'
if (!onPostgres) console.log(`[tests] tests/api/scale.test.ts skipped on SQLite: ${REASON}`)

const PATIENTS = 200
const EMAILS = 300

let mail: MailCatcher
let a: RunningApp
let b: RunningApp
let patients: LoadPatient[]

/** Both instances start with a short resume interval, so an interrupted run is taken over within a second. */
const env = { NUXT_TASK_RESUME_MS: '300', NUXT_TASK_LEASE_MS: '3000' }

beforeAll(async () => {
  if (!onPostgres) return
  mail = await MailCatcher.start()
  const databaseUrl = await createDatabase()
  a = await startApp({ smtpUrl: mail.url, databaseUrl, env })
  await addLoadPatients(a, PATIENTS)
  b = await startApp({ smtpUrl: mail.url, databaseUrl, env })
  patients = await signInLoadPatients(a, PATIENTS, 10)
}, 180_000)

afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()])
  await mail?.stop()
})

/** Sends again after a 503 (Retry-After), the same body, as a client does; nothing of a refused write was stored. */
async function untilAccepted(send: () => Promise<Reply>): Promise<Reply> {
  for (let tries = 0; ; tries++) {
    const reply = await send()
    if (reply.status !== 503 || tries >= 10) return reply
    await new Promise(r => setTimeout(r, Number(reply.headers.get('retry-after') ?? 1) * 1000))
  }
}

describe.skipIf(!onPostgres)('two app instances on one PostgreSQL database', () => {
  it(`${PATIENTS} diaries sent at once, half to each instance: every one acknowledged and stored once, with its one queue item`, async () => {
    const bodies = patients.map((_, n) => diaryWithNote(n))
    const replies = await Promise.all(patients.map((p, n) => {
      const client = n % 2 ? p.client.on(b.url) : p.client
      return untilAccepted(() => client.post(`/api/patients/${p.patientId}/diary`, bodies[n]))
    }))
    expect(replies.map(r => r.status).filter(s => s !== 201)).toEqual([])
    const ids = patients.map(p => p.patientId)
    const stored = await sql<{ patientId: number, draftId: string, items: number }>(a,
      `SELECT d.patient_id AS "patientId", d.draft_id AS "draftId", (SELECT COUNT(*) FROM triage_items t WHERE t.diary_entry_id = d.id) AS items
       FROM diary_entries d WHERE d.patient_id = ANY($1::int[])`, [ids])
    expect(stored).toHaveLength(PATIENTS)
    expect(new Set(stored.map(r => r.patientId)).size).toBe(PATIENTS)
    expect(stored.map(r => r.draftId).sort()).toEqual(bodies.map(body => body.draftId).sort())
    expect(stored.every(r => r.items === 1)).toBe(true)
  }, 180_000)

  it(`the outbox drained by both instances at once sends each of ${EMAILS} e-mails exactly once`, async () => {
    await sql(a, `INSERT INTO outbox_messages (to_address, subject, text, html, attachments, status, attempts, next_attempt_at, created_at, updated_at)
      SELECT 'scale-' || n || '@demo.tidewell.test', 'Scale test ' || n, 'Body ' || n, '<p>Body ' || n || '</p>', '[]', 'pending', 0, now(), now(), now()
      FROM generate_series(1, ${EMAILS}) AS n`)
    await expect.poll(async () => (await sql<{ n: number }>(a, `SELECT COUNT(*) AS n FROM outbox_messages WHERE subject LIKE 'Scale test %' AND status = 'sent'`))[0]!.n,
      { timeout: 60_000, interval: 250 }).toBe(EMAILS)
    // Whatever is still in flight has arrived once every row says sent; wait a moment for a duplicate that would follow.
    await new Promise(r => setTimeout(r, 1000))
    const subjects = mail.messages.map(m => m.subject).filter(s => s.startsWith('Scale test '))
    expect(subjects).toHaveLength(EMAILS)
    expect(new Set(subjects).size).toBe(EMAILS)
    const attempts = await sql<{ attempts: number, n: number }>(a, `SELECT attempts, COUNT(*) AS n FROM outbox_messages WHERE subject LIKE 'Scale test %' GROUP BY attempts`)
    expect(attempts).toEqual([{ attempts: 1, n: EMAILS }])
  }, 90_000)

  it('the same tick of a scheduled task started on both instances runs once', async () => {
    // One sign-in, its session used on both (a second factor's code is good once, on any instance).
    const adminA = await Client.signIn(a.url, 'admin@demo.tidewell.test')
    const adminB = adminA.on(b.url)
    const slot = `tick:scale-${Date.now()}`
    const replies = await Promise.all([adminA.post('/api/admin/tasks/diary:remind', { slot }), adminB.post('/api/admin/tasks/diary:remind', { slot })])
    expect(replies.map(r => r.status)).toEqual([200, 200])
    const results = replies.map(r => (r.body as { result: Record<string, unknown> }).result)
    expect(results.filter(r => typeof r.reminded === 'number')).toHaveLength(1)
    expect(results.filter(r => r.ranElsewhere === slot)).toHaveLength(1)
    expect(await sql(a, 'SELECT status, attempts FROM task_runs WHERE slot = ?', [slot])).toEqual([{ status: 'done', attempts: 1 }])
    // A run asked for without a slot is the admin's own and always runs.
    const asked = await adminB.post('/api/admin/tasks/diary:remind', {})
    expect(typeof (asked.body as { result: Record<string, unknown> }).result.reminded).toBe('number')
  }, 60_000)

  it('a run left unfinished by an instance that died is taken over by one that is alive, once', async () => {
    const slot = `tick:crashed-${Date.now()}`
    await sql(a, `INSERT INTO task_runs (name, slot, run_as_of, status, holder, lease_until, attempts, created_at, updated_at)
      VALUES ('triage:escalate', ?, now(), 'running', 'gone-host:1:dead', now() - interval '1 second', 1, now(), now())`, [slot])
    await expect.poll(async () => (await sql<{ status: string }>(a, 'SELECT status FROM task_runs WHERE slot = ?', [slot]))[0]!.status,
      { timeout: 20_000, interval: 200 }).toBe('done')
    const [run] = await sql<{ holder: string, attempts: number }>(a, 'SELECT holder, attempts FROM task_runs WHERE slot = ?', [slot])
    expect(run!.holder).not.toBe('gone-host:1:dead')
    expect(run!.attempts).toBe(2)
  }, 30_000)

  it('a session made on one instance works on the other, and ending it there ends it on both', async () => {
    const onA = await Client.signIn(a.url, 'nurse@demo.tidewell.test')
    const onB = onA.on(b.url)
    expect((await onB.get('/api/triage')).status).toBe(200)
    expect((await onB.post('/api/auth/sign-out-everywhere', {})).status).toBe(200)
    expect((await onA.get('/api/triage')).status).toBe(401)
  })

  it('wrong passwords sent to both instances at once count exactly the limit for the account', async () => {
    const email = `load-${PATIENTS}@demo.tidewell.test`
    const replies = await Promise.all(Array.from({ length: 20 }, (_, n) => new Client(n % 2 ? b.url : a.url).post('/api/auth/sign-in', { email, password: 'not the password' })))
    const statuses = replies.map(r => r.status)
    // Five failures lock an account (server/utils/auth/sign-in-limit.ts, as in load-writes.test.ts).
    expect(statuses.filter(s => s === 401)).toHaveLength(5)
    expect(statuses.filter(s => s === 429)).toHaveLength(15)
    expect((await new Client(b.url).post('/api/auth/sign-in', { email, password: DEMO_PASSWORD })).status).toBe(429)
  })
})
