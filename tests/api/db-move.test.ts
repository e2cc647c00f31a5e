import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { diaryEntry } from '../support/diary'
import { createDatabase, onPostgres } from '../support/postgres'
import { runScript } from '../support/scripts'
import { sql } from '../support/sqlite'

/*
 * Issue 14: `npm run db:move` moves a clinic from its SQLite file to a new PostgreSQL
 * database. Here: the demo clinic with its activity and a diary sent, moved with the
 * server stopped, every table counted and compared row by row, then the app started on
 * PostgreSQL alone.
 */

const REASON = 'moving needs a PostgreSQL server, which the PostgreSQL pass starts (TIDEWELL_DB=postgres)'
if (!onPostgres) console.log(`[tests] tests/api/db-move.test.ts skipped on SQLite: ${REASON}`)

let source: RunningApp
let moved: RunningApp | undefined
let databaseUrl: string

beforeAll(async () => {
  if (!onPostgres) return
  source = await startApp({ databaseUrl: null, env: { NUXT_SEED_DEMO_ACTIVITY: 'true' } })
  const patient = await Client.signIn(source.url, 'patient@demo.tidewell.test')
  expect((await patient.post(`/api/patients/${await ownPatientId(patient)}/diary`, diaryEntry({ note: 'Moved with the clinic.' }))).status).toBe(201)
  databaseUrl = await createDatabase()
}, 120_000)

afterAll(async () => {
  await moved?.stop()
  await source?.stop()
})

const ownPatientId = async (patient: Client) => ((await patient.get('/api/me/patients')).body as { patientId: number }[])[0]!.patientId

/** Every table of the file but the migrations' own, read back the same way from either side. */
const tablesOf = async (file: string) => (await sql<{ name: string }>(file, `SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name <> 'schema_migrations' ORDER BY name`)).map(r => r.name)
const rowsOf = async (database: Parameters<typeof sql>[0], table: string) => (await sql(database, `SELECT * FROM ${table}`)).map(row => JSON.stringify(row)).sort()

describe.skipIf(!onPostgres)('npm run db:move', () => {
  it('refuses while the server has the file open', async () => {
    const refused = await runScript('db-move.mjs', [], { NUXT_DATABASE_PATH: source.dbPath, NUXT_DATABASE_URL: databaseUrl })
    expect(refused.code, refused.out).toBe(1)
    expect(refused.out).toContain('stop the server first')
  })

  it('moves the demo clinic with the server stopped: every table, every row, the same values', async () => {
    await source.stop({ keepData: true })
    const done = await runScript('db-move.mjs', [], { NUXT_DATABASE_PATH: source.dbPath, NUXT_DATABASE_URL: databaseUrl })
    expect(done.code, done.out).toBe(0)
    const target = { dbPath: '', databaseUrl }
    const tables = await tablesOf(source.dbPath)
    expect(tables).toContain('diary_entries')
    let total = 0
    for (const table of tables) {
      const [from, to] = await Promise.all([rowsOf(source.dbPath, table), rowsOf(target, table)])
      expect(to, table).toEqual(from)
      expect(done.out).toMatch(new RegExp(`${table}\\s+${from.length} →\\s+${from.length}\\b`))
      total += from.length
    }
    expect(total).toBeGreaterThan(200)
    expect(await sql(target, 'SELECT name FROM schema_migrations ORDER BY name')).toEqual(await sql(source.dbPath, 'SELECT name FROM schema_migrations ORDER BY name'))
  })

  it('the app then runs on PostgreSQL: the moved patient signs in, sees his entries and sends a new one', async () => {
    moved = await startApp({ databaseUrl, env: { NUXT_SEED_DEMO: 'false' } })
    const patient = await Client.signIn(moved.url, 'patient@demo.tidewell.test')
    const patientId = await ownPatientId(patient)
    const before = await sql<{ n: number }>(moved, 'SELECT COUNT(*) AS n FROM diary_entries WHERE patient_id = ?', [patientId])
    expect((await sql<{ n: number }>(source.dbPath, 'SELECT COUNT(*) AS n FROM diary_entries WHERE patient_id = ?', [patientId]))).toEqual(before)
    const sent = await patient.post(`/api/patients/${patientId}/diary`, diaryEntry({ note: 'First one on PostgreSQL.' }))
    expect(sent.status).toBe(201)
    expect(await sql(moved, 'SELECT COUNT(*) AS n FROM diary_entries WHERE patient_id = ?', [patientId])).toEqual([{ n: before[0]!.n + 1 }])
  })

  it('refuses to move into a database that already holds a clinic', async () => {
    const again = await runScript('db-move.mjs', [], { NUXT_DATABASE_PATH: source.dbPath, NUXT_DATABASE_URL: databaseUrl })
    expect(again.code, again.out).toBe(1)
    expect(again.out).toContain('not empty')
  })
})
