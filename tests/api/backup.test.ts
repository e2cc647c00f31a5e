import { randomUUID } from 'node:crypto'
import { mkdtempSync, readdirSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { diaryEntry } from '../support/diary'
import { runScript } from '../support/scripts'
import { sql } from '../support/sqlite'
import { onPostgres, skippedOnPostgres } from '../support/postgres'

/*
 * Issue 10: copying the database file alone lost 179 of 1,212 recent entries (they were
 * still in the -wal file). `npm run backup` uses SQLite's online backup API while the
 * server runs and writes; `npm run restore FILE` puts the copy back with the server
 * stopped, and refuses while it runs.
 */

const PATIENTS = ['patient', 'bernard', 'luis', 'odell', 'franklin', 'kenji', 'ramon', 'desmond']

const entryIds = async (dbPath: string) => new Set((await sql<{ id: number }>(dbPath, 'SELECT id FROM diary_entries')).map(r => r.id))

let app: RunningApp
let restored: RunningApp | undefined
const folders: string[] = []
const folder = () => {
  const made = mkdtempSync(join(tmpdir(), 'tidewell-backup-test-'))
  folders.push(made)
  return made
}

beforeAll(async () => {
  if (!onPostgres) app = await startApp()
})
afterAll(async () => {
  await app?.stop()
  await restored?.stop()
  for (const made of folders) rmSync(made, { recursive: true, force: true })
})

skippedOnPostgres('tests/api/backup.test.ts', 'npm run backup and restore copy the SQLite file; on PostgreSQL backups are pg_dump (README, Running at scale)')

describe.skipIf(onPostgres)('npm run backup and npm run restore', () => {
  it('a backup taken while diaries are being sent restores into a fresh server whole, with every entry acknowledged before it started', async () => {
    const me = await Promise.all(PATIENTS.map(async (name) => {
      const email = `${name}@demo.tidewell.test`
      const client = await Client.signIn(app.url, email)
      const session = (await client.get('/api/_auth/session')).body as { user: { patientId: number } }
      return { email, client, patientId: session.user.patientId }
    }))

    // Eight patients send diaries one after another, all at the same time, until told to stop.
    const acknowledged: number[] = []
    const failures: number[] = []
    let writing = true
    const writers = me.map(async ({ client, patientId }) => {
      while (writing) {
        const reply = await client.post(`/api/patients/${patientId}/diary`, { ...diaryEntry(), draftId: randomUUID() })
        if (reply.status === 201) acknowledged.push(reply.body.id as number)
        else failures.push(reply.status)
      }
    })
    while (acknowledged.length < 40) await new Promise(r => setTimeout(r, 50))

    const before = new Set(acknowledged) // acknowledged (201) before the backup started
    const backups = folder()
    const backup = await runScript('backup.mjs', [backups], { NUXT_DATABASE_PATH: app.dbPath })
    const duringOrAfter = acknowledged.length - before.size
    await new Promise(r => setTimeout(r, 300))
    writing = false
    await Promise.all(writers)

    expect(backup.code, backup.out).toBe(0)
    expect(failures).toEqual([])
    expect(duringOrAfter).toBeGreaterThan(0) // the server kept writing while the copy was made
    const files = readdirSync(backups)
    expect(files).toHaveLength(1)
    expect(files[0]).toMatch(/^tidewell-\d{8}-\d{6}\.sqlite$/)

    // Restore into a new, empty data folder, then start a server on it.
    const fresh = folder()
    const freshDb = join(fresh, 'tidewell.sqlite')
    const restore = await runScript('restore.mjs', [join(backups, files[0]!)], { NUXT_DATABASE_PATH: freshDb })
    expect(restore.code, restore.out).toBe(0)
    restored = await startApp({ dataDir: fresh })

    expect(await sql(restored, 'PRAGMA integrity_check')).toEqual([{ integrity_check: 'ok' }])
    const kept = await entryIds(restored.dbPath)
    const missing = [...before].filter(id => !kept.has(id))
    expect(missing).toEqual([])
    // The restored server serves them: the patient reads his last acknowledged entry.
    const last = [...before].at(-1)!
    const owner = (await sql<{ patient_id: number }>(restored, 'SELECT patient_id FROM diary_entries WHERE id = ?', [last]))[0]!.patient_id
    const signedIn = await Client.signIn(restored.url, me.find(p => p.patientId === owner)!.email)
    const entry = await signedIn.get(`/api/patients/${owner}/diary/${last}`)
    expect(entry.status).toBe(200)
    expect(entry.body.id).toBe(last)
  })

  it('restore refuses while the server runs, and after it stops puts the backup back and keeps the replaced database aside', async () => {
    const backups = folder()
    const backup = await runScript('backup.mjs', [backups], { NUXT_DATABASE_PATH: app.dbPath })
    expect(backup.code, backup.out).toBe(0)
    const [file] = readdirSync(backups)
    const inBackup = await entryIds(join(backups, file!))

    // One more entry after the backup: it is in the live database, not in the backup.
    const patient = await Client.signIn(app.url, 'howard@demo.tidewell.test')
    const patientId = ((await patient.get('/api/_auth/session')).body as { user: { patientId: number } }).user.patientId
    const later = await patient.post(`/api/patients/${patientId}/diary`, { ...diaryEntry(), draftId: randomUUID() })
    expect(later.status).toBe(201)
    const live = await entryIds(app.dbPath)
    expect(inBackup.has(later.body.id)).toBe(false)

    const refused = await runScript('restore.mjs', [join(backups, file!)], { NUXT_DATABASE_PATH: app.dbPath })
    expect(refused.code).toBe(1)
    expect(refused.out).toMatch(/in use: stop the server first/)
    expect(await entryIds(app.dbPath)).toEqual(live)
    expect(readdirSync(app.dataDir).filter(name => name.includes('.replaced-'))).toEqual([])

    await app.stop({ keepData: true })
    const done = await runScript('restore.mjs', [join(backups, file!)], { NUXT_DATABASE_PATH: app.dbPath })
    expect(done.code, done.out).toBe(0)
    expect(await entryIds(app.dbPath)).toEqual(inBackup)
    const aside = readdirSync(app.dataDir).filter(name => /^tidewell\.sqlite\.replaced-\d{8}-\d{6}$/.test(name))
    expect(aside).toHaveLength(1)
    // The replaced database holds everything the live one had, the later entry too.
    expect(await entryIds(join(app.dataDir, aside[0]!))).toEqual(live)
    expect(await sql(app, 'PRAGMA integrity_check')).toEqual([{ integrity_check: 'ok' }])
    rmSync(app.dataDir, { recursive: true, force: true })
  })
})
