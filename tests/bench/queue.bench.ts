import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { emptyDiaryEntry } from '#shared/diary/schemas'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { sql } from '../support/sqlite'
import { percentiles, report, timed } from './figures'

const PATIENTS = 10_000
const ENTRIES = 500_000
// Sequelize writes dates to SQLite as 'YYYY-MM-DD HH:MM:SS.SSS +00:00'.
const AT = (offset: string) => `strftime('%Y-%m-%d %H:%M:%f +00:00', 'now', ${offset})`

/**
 * Generates the data set inside SQLite (recursive CTEs, not committed anywhere):
 * 10,000 patients, 500,000 diary entries over 50 weeks, and a queue item for every
 * entry that reached a level (about one in ten), all closed but the latest 1,500.
 */
async function generate(dbPath: string) {
  const answers = JSON.stringify(emptyDiaryEntry()).replace(/'/g, `''`)
  await sql(dbPath, `WITH RECURSIVE n(i) AS (SELECT 1 UNION ALL SELECT i + 1 FROM n WHERE i < ${PATIENTS})
    INSERT INTO users (email, password_hash, role, name, language, active, created_at, updated_at)
    SELECT 'bench' || i || '@bench.tidewell.test', NULL, 'patient', 'Bench Patient ' || i, 'en', 1, ${AT(`'-400 days'`)}, ${AT(`'-400 days'`)} FROM n`)
  await sql(dbPath, `INSERT INTO patients (user_id, clinic_number, date_of_birth, created_at, updated_at)
    SELECT id, 'B-' || id, '1950-01-01', created_at, updated_at FROM users WHERE email LIKE 'bench%'`)
  const [{ first }] = await sql<{ first: number }>(dbPath, `SELECT MIN(id) AS first FROM patients WHERE clinic_number LIKE 'B-%'`) as [{ first: number }]
  await sql(dbPath, `WITH RECURSIVE n(i) AS (SELECT 0 UNION ALL SELECT i + 1 FROM n WHERE i < ${ENTRIES - 1})
    INSERT INTO diary_entries (patient_id, entered_by_user_id, answers, level, reasons, respond_by, note_flagged, flare_watch_active, rules_version, hot_flush_score, worst_pain, submitted_at)
    SELECT ${first} + (i % ${PATIENTS}), (SELECT user_id FROM patients WHERE id = ${first} + (i % ${PATIENTS})), '${answers}',
      CASE WHEN i % 97 = 0 THEN 'emergency' WHEN i % 23 = 0 THEN 'urgent' WHEN i % 11 = 0 THEN 'routine' ELSE 'none' END,
      '[]', ${AT(`'-' || ((${ENTRIES} - i) * 60) || ' seconds'`)}, 0, 0, 'bench', i % 20, i % 11,
      ${AT(`'-' || ((${ENTRIES} - i) * 60) || ' seconds'`)}
    FROM n`)
  await sql(dbPath, `INSERT INTO triage_items (patient_id, source, source_key, diary_entry_id, level, reasons, respond_by, status, assignee_user_id, disposition, escalated_at, closed_at, created_at, updated_at)
    SELECT patient_id, 'diary', 'diary:' || id, id, level, '[]', respond_by, 'closed', NULL, 'no-action', NULL, submitted_at, submitted_at, submitted_at
    FROM diary_entries WHERE level != 'none' AND rules_version = 'bench'`)
  await sql(dbPath, `UPDATE triage_items SET status = 'new', closed_at = NULL, disposition = NULL
    WHERE id IN (SELECT id FROM triage_items ORDER BY id DESC LIMIT 1500)`)
  await sql(dbPath, 'ANALYZE')
}

describe('triage queue query at scale', () => {
  let app: RunningApp
  beforeAll(async () => {
    const seeded = await startApp()
    await seeded.stop({ keepData: true })
    const [ms] = await timed(() => generate(seeded.dbPath))
    console.log(`[bench] generated ${PATIENTS.toLocaleString('en-US')} patients and ${ENTRIES.toLocaleString('en-US')} diary entries in ${(ms / 1000).toFixed(1)} s`)
    app = await startApp({ dataDir: seeded.dataDir, env: { NUXT_OUTBOX_POLL_MS: '0' } })
  })
  afterAll(() => app?.stop())

  it('prints median and 95th percentile for the queue and its filters', async () => {
    const [{ n: entries }] = await sql<{ n: number }>(app, 'SELECT COUNT(*) AS n FROM diary_entries') as [{ n: number }]
    const [{ n: open }] = await sql<{ n: number }>(app, `SELECT COUNT(*) AS n FROM triage_items WHERE status != 'closed'`) as [{ n: number }]
    expect(entries).toBeGreaterThanOrEqual(ENTRIES)
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const rows: Record<string, string> = { 'diary entries': entries.toLocaleString('en-US'), 'open queue items': open.toLocaleString('en-US') }
    for (const [label, path] of [
      ['open queue, first page', '/api/triage'],
      ['urgent only', '/api/triage?level=urgent'],
      ['search by name', '/api/triage?q=Patient%20123'],
      ['mine', '/api/triage?assignee=me'],
      ['closed, page 20', '/api/triage?status=closed&page=20'],
    ] as const) {
      await nurse.get(path)
      const samples: number[] = []
      for (let i = 0; i < 40; i++) {
        const [ms, reply] = await timed(() => nurse.get(path))
        expect(reply.status).toBe(200)
        samples.push(ms)
      }
      const { median, p95 } = percentiles(samples)
      rows[label] = `median ${median.toFixed(1)} ms, p95 ${p95.toFixed(1)} ms`
    }
    report(`GET /api/triage with ${PATIENTS.toLocaleString('en-US')} patients and ${ENTRIES.toLocaleString('en-US')} diary entries (40 requests each)`, rows)
  })
})
