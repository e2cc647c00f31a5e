import { rmSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import type { LoadPatient } from '../support/load'
import { diaryWithNote, signInLoadPatients, startAppWithPatients } from '../support/load'
import { sql } from '../support/sqlite'
import { onPostgres } from '../support/postgres'

/*
 * A power cut in the middle of 50 writes (kill -9 of the server): after a restart on the
 * same file, every diary the server acknowledged is there, the file is sound, and no
 * entry lacks the queue item its note opened (a transaction is all or nothing).
 */

const PATIENTS = 50
let app: RunningApp
let restarted: RunningApp | undefined
let patients: LoadPatient[]

beforeAll(async () => {
  app = await startAppWithPatients(PATIENTS)
  patients = await signInLoadPatients(app, PATIENTS)
}, 120_000)

afterAll(async () => {
  await restarted?.stop()
  await app?.stop()
  rmSync(app.dataDir, { recursive: true, force: true })
})

describe('kill -9 during 50-way writes', () => {
  it('keeps every acknowledged entry, passes integrity_check and leaves nothing half-written', async () => {
    let acknowledgedSoFar = 0
    let crashed: Promise<void> | undefined
    const outcomes = await Promise.all(patients.map(async (p, n) => {
      try {
        const reply = await p.client.post(`/api/patients/${p.patientId}/diary`, diaryWithNote(n))
        if (reply.status === 201) {
          acknowledgedSoFar++
          // Pull the plug once a few are acknowledged, while the rest are in flight.
          if (acknowledgedSoFar === 5) crashed = app.crash()
        }
        return { patientId: p.patientId, status: reply.status, id: reply.body?.id as number | undefined }
      }
      catch {
        return { patientId: p.patientId, status: 0, id: undefined }
      }
    }))
    await (crashed ?? app.crash())
    const acknowledged = outcomes.filter(o => o.status === 201)
    expect(acknowledged.length).toBeGreaterThanOrEqual(5)
    // Only acknowledgements or cut connections: no 500 before the cut.
    expect(outcomes.every(o => o.status === 201 || o.status === 0), JSON.stringify(outcomes.map(o => o.status))).toBe(true)

    restarted = await startApp({ dataDir: app.dataDir })
    // The file is sound (SQLite; on PostgreSQL the database server was never cut).
    if (!onPostgres) expect(await sql(restarted, 'PRAGMA integrity_check')).toEqual([{ integrity_check: 'ok' }])

    const ids = patients.map(p => p.patientId)
    const stored = await sql<{ id: number, patientId: number, items: number, events: number }>(restarted,
      `SELECT d.id AS id, d.patient_id AS "patientId",
         (SELECT COUNT(*) FROM triage_items t WHERE t.diary_entry_id = d.id) AS items,
         (SELECT COUNT(*) FROM triage_events e JOIN triage_items t ON t.id = e.item_id WHERE t.diary_entry_id = d.id) AS events
       FROM diary_entries d WHERE d.patient_id IN (${ids.map(() => '?').join(',')})`, ids)
    const storedIds = new Set(stored.map(e => e.id))
    for (const entry of acknowledged) expect(storedIds.has(entry.id!), `acknowledged entry ${entry.id}`).toBe(true)
    // Stored ones that were not acknowledged may exist (committed as the plug was pulled),
    // but each is whole: one entry per patient, each with its queue item and its timeline.
    expect(new Set(stored.map(e => e.patientId)).size).toBe(stored.length)
    expect(stored.filter(e => e.items !== 1)).toEqual([])
    expect(stored.filter(e => e.events < 1)).toEqual([])
    const orphans = await sql<{ n: number }>(restarted, 'SELECT COUNT(*) AS n FROM triage_items t LEFT JOIN diary_entries d ON d.id = t.diary_entry_id WHERE t.diary_entry_id IS NOT NULL AND d.id IS NULL')
    expect(orphans[0]!.n).toBe(0)
  }, 180_000)
})
