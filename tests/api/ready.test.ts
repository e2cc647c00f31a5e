import { randomUUID } from 'node:crypto'
import { chmodSync, readFileSync, rmSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { freePort } from '../support/ports'
import { sql } from '../support/sqlite'
import { onPostgres } from '../support/postgres'

/*
 * Issue 10: /api/ready tells the truth. /api/health answered {"ok":true} with a read-only
 * database, a full disk and the mail server down; /api/ready answers 503 and names the
 * check that failed.
 *
 * A read-only database, for real: root writes through any file mode, so when these tests
 * run as root the server runs as the unprivileged user "nobody" (it owns its data folder).
 * The database file loses its write bits while the server is stopped; started again,
 * SQLite can open it only read-only, and the write probe fails with SQLITE_READONLY. As
 * another user, chmod alone does it.
 */

const asUnprivileged = (() => {
  if (process.getuid?.() !== 0) return undefined
  const line = readFileSync('/etc/passwd', 'utf8').split('\n').find(l => l.startsWith('nobody:'))
  if (!line) throw new Error('running as root and no user "nobody" to run the server as')
  const [, , uid, gid] = line.split(':')
  return { uid: Number(uid), gid: Number(gid) }
})()

/** The way Sequelize stores a date in SQLite, and back. */
const stored = (at: Date) => at.toISOString().replace('T', ' ').replace('Z', ' +00:00')
const parsed = (text: string) => new Date(text.replace(' ', 'T').replace(' +00:00', 'Z'))

let plain: RunningApp
let stuck: RunningApp
let tight: RunningApp

beforeAll(async () => {
  const closedPort = await freePort() // nothing listens there: every send fails at once
  ;[plain, stuck, tight] = await Promise.all([
    startApp({ user: asUnprivileged }),
    // First retry 10 minutes after a failure for ordinary e-mail; alerts keep their own schedule.
    startApp({ smtpUrl: `smtp://127.0.0.1:${closedPort}`, env: { NUXT_OUTBOX_RETRY_BASE_MS: '600000', NUXT_READY_MAX_OUTBOX_AGE_MIN: '15' } }),
    // More free space asked for than any test machine has (1,000 TB).
    startApp({ env: { NUXT_READY_MIN_FREE_MB: String(1_000 * 1024 * 1024 * 1024) } }),
  ])
})
afterAll(async () => {
  await Promise.all([plain?.stop(), stuck?.stop(), tight?.stop()])
})

const ready = (app: RunningApp) => new Client(app.url).get('/api/ready')

describe('GET /api/ready', () => {
  it('answers 200 when the database takes a write, the disk has room and no e-mail is late, and needs no sign-in', async () => {
    const reply = await ready(plain)
    expect(reply.status, JSON.stringify(reply.body)).toBe(200)
    expect(reply.body).toMatchObject({ ok: true, failed: [], checks: { database: { ok: true }, disk: { ok: true, minFreeMb: 200 }, outbox: { ok: true, maxAgeMinutes: 15 } } })
    expect(reply.headers.get('cache-control')).toBe('no-store')
  })

  // On PostgreSQL the database is not a file of the app's; the probe's write (txid_current) is the same code path.
  it.skipIf(onPostgres)('answers 503 naming the database when the database file is read-only, and 200 again once it is writable', async () => {
    // The server keeps its writer connection open, and a file mode only counts when a file
    // is opened: stop the server, take the write bits off the file, start it again.
    const { dataDir, dbPath } = plain
    await plain.stop({ keepData: true })
    chmodSync(dbPath, 0o444)
    let again: RunningApp | undefined
    try {
      again = await startApp({ dataDir, user: asUnprivileged, env: { NUXT_SEED_DEMO: 'false' } })
      const reply = await ready(again)
      expect(reply.status, JSON.stringify(reply.body)).toBe(503)
      expect(reply.body.ok).toBe(false)
      expect(reply.body.failed).toEqual(['database'])
      expect(reply.body.checks.database.error).toMatch(/SQLITE_READONLY|readonly/i)
      // The liveness check still answers: the process is up, it is only not ready.
      expect((await new Client(again.url).get('/api/health')).status).toBe(200)
    }
    finally {
      await again?.stop()
      chmodSync(dbPath, 0o644)
    }
    const writable = await startApp({ dataDir, user: asUnprivileged, env: { NUXT_SEED_DEMO: 'false' } })
    try {
      expect((await ready(writable)).status).toBe(200)
    }
    finally {
      await writable.stop()
      rmSync(dataDir, { recursive: true, force: true })
    }
  })

  it('answers 503 naming the disk when it has less free space than NUXT_READY_MIN_FREE_MB', async () => {
    const reply = await ready(tight)
    expect(reply.status, JSON.stringify(reply.body)).toBe(503)
    expect(reply.body.failed).toEqual(['disk'])
    expect(reply.body.checks.disk.freeMb).toBeLessThan(reply.body.checks.disk.minFreeMb)
  })

  it('with the mail server down: an alert is tried again within two minutes while an ordinary e-mail waits; 503 once an e-mail has waited over 15 minutes', async () => {
    const nurse = await Client.signIn(stuck.url, 'nurse@demo.tidewell.test')
    const roster = (await nurse.get('/api/patients')).body as { id: number, clinicNumber: string }[]
    const patientId = roster.find(p => p.clinicNumber === 'LPU-1004')!.id
    const patient = await Client.signIn(stuck.url, 'odell@demo.tidewell.test')
    expect((await patient.post(`/api/patients/${patientId}/diary/right-now`, { draftId: randomUUID(), items: ['chestPain'] })).status).toBe(201)
    expect((await new Client(stuck.url).post('/api/auth/forgot-password', { email: 'cyril@demo.tidewell.test' })).status).toBe(202)

    type Row = { id: number, dedupe_key: string | null, attempts: number, next_attempt_at: string, updated_at: string, last_error: string | null, to_address: string }
    const rows = () => sql<Row>(stuck, 'SELECT id, dedupe_key, attempts, next_attempt_at, updated_at, last_error, to_address FROM outbox_messages WHERE status = \'pending\'')
    const alertRows = (all: Row[]) => all.filter(r => r.dedupe_key?.startsWith('triageAlert:'))
    const resetRow = (all: Row[]) => all.find(r => r.to_address === 'cyril@demo.tidewell.test')
    // The worker polls every 200 ms here; wait until it has tried each once.
    let all: Row[] = []
    for (let i = 0; i < 100; i++) {
      all = await rows()
      if (alertRows(all).length && alertRows(all).every(r => r.attempts >= 1) && (resetRow(all)?.attempts ?? 0) >= 1) break
      await new Promise(r => setTimeout(r, 200))
    }
    const alerts = alertRows(all)
    const reset = resetRow(all)!
    expect(alerts.length).toBeGreaterThan(0)
    expect(reset.attempts).toBe(1)
    const waitAfterTry = (r: Row) => parsed(r.next_attempt_at).getTime() - parsed(r.updated_at).getTime()
    for (const alert of alerts) {
      expect(alert.last_error).toBeTruthy()
      expect(waitAfterTry(alert)).toBeLessThanOrEqual(2 * 60 * 1000) // the alert ceiling
    }
    expect(waitAfterTry(reset)).toBeGreaterThanOrEqual(10 * 60 * 1000 - 1000) // the ordinary base, 10 minutes here

    // Failing, but not for long yet: still ready.
    const young = await ready(stuck)
    expect(young.status, JSON.stringify(young.body)).toBe(200)
    expect(young.body.checks.outbox.oldestMinutes).toBeLessThan(15)

    await sql(stuck, 'UPDATE outbox_messages SET created_at = ? WHERE id = ?', [stored(new Date(Date.now() - 20 * 60 * 1000)), reset.id])
    const late = await ready(stuck)
    expect(late.status, JSON.stringify(late.body)).toBe(503)
    expect(late.body.failed).toEqual(['outbox'])
    expect(late.body.checks.outbox.oldestMinutes).toBeGreaterThanOrEqual(20)
  })
})

describe('GET /api/admin/outbox', () => {
  it('shows an admin the backlog, the states, the last send error and the next try, without addresses or contents, and is audited', async () => {
    // Runs after the test above on the same server: e-mails are waiting, the mail server is down.
    const admin = await Client.signIn(stuck.url, 'admin@demo.tidewell.test')
    const reply = await admin.get('/api/admin/outbox')
    expect(reply.status).toBe(200)
    const pending = await sql<{ n: number }>(stuck, 'SELECT COUNT(*) AS n FROM outbox_messages WHERE status = \'pending\'')
    expect(reply.body.backlog.count).toBe(pending[0]!.n)
    expect(reply.body.backlog.count).toBeGreaterThanOrEqual(2)
    expect(reply.body.backlog.alerts).toBeGreaterThan(0)
    expect(reply.body.backlog.oldestMinutes).toBeGreaterThanOrEqual(20)
    expect(reply.body.states.waiting + reply.body.states.retrying).toBe(reply.body.backlog.count)
    expect(reply.body.lastError.message).toMatch(/ECONNREFUSED|connect/i)
    expect(Number.isNaN(new Date(reply.body.lastError.at).getTime())).toBe(false)
    expect(Number.isNaN(new Date(reply.body.nextAttemptAt).getTime())).toBe(false)
    const text = JSON.stringify(reply.body)
    expect(text).not.toMatch(/@/)
    expect(text).not.toMatch(/password|subject|TW-\d/i)

    const nurse = await Client.signIn(stuck.url, 'nurse@demo.tidewell.test')
    expect((await nurse.get('/api/admin/outbox')).status).toBe(403)
    const audited = await sql<{ action: string }>(stuck, 'SELECT action FROM audit_events WHERE action = \'outbox.read\'')
    expect(audited).toHaveLength(1)

    // The page, rendered on the server, says the same in words.
    const page = await admin.get('/admin/outbox')
    expect(page.status).toBe(200)
    expect(page.body).toContain('E-mail outbox')
    expect(page.body).toContain(`${reply.body.backlog.count} e-mails waiting`)
    expect(page.body).toContain('ECONNREFUSED')
  })
})
