import { randomUUID } from 'node:crypto'
import { rmSync } from 'node:fs'
import type { RunningApp } from './app'
import { startApp } from './app'
import { Client } from './client'
import { diaryEntry } from './diary'
import { sql } from './sqlite'

export interface LoadPatient {
  email: string
  patientId: number
  client: Client
}

/** Adds load-1 … load-N to a stopped (or running) server's database (the password hash of a demo patient copied). */
export async function addLoadPatients(app: RunningApp, count: number) {
  const statements: string[] = []
  for (let n = 1; n <= count; n++) {
    statements.push(`INSERT INTO users (email, password_hash, role, name, language, active, created_at, updated_at)
      SELECT 'load-${n}@demo.tidewell.test', password_hash, 'patient', 'Load Patient ${n}', 'en', true, created_at, updated_at
      FROM users WHERE email = 'howard@demo.tidewell.test'`)
    statements.push(`INSERT INTO patients (user_id, clinic_number, date_of_birth, created_at, updated_at)
      SELECT id, 'LOAD-${String(n).padStart(4, '0')}', '1950-06-01', created_at, updated_at
      FROM users WHERE email = 'load-${n}@demo.tidewell.test'`)
  }
  await sql(app, `BEGIN; ${statements.join(';\n')}; COMMIT;`, [], { exec: true })
}

/**
 * A server whose database holds `count` more patients than the demo clinic (load-1 ...
 * load-N, password DEMO_PASSWORD). The demo clinic has only a few, so the first server
 * migrates and seeds the database, stops, the patients are added straight into it, and
 * the server starts again on the same data.
 */
export async function startAppWithPatients(count: number, env: Record<string, string> = {}): Promise<RunningApp> {
  const first = await startApp({ env })
  await first.stop({ keepData: true })
  await addLoadPatients(first, count)
  const app = await startApp({ env, dataDir: first.dataDir })
  return {
    ...app,
    stop: async (options) => {
      await app.stop(options)
      if (!options?.keepData) rmSync(app.dataDir, { recursive: true, force: true })
    },
  }
}

/** Signs the load patients in, a few at a time (each sign-in checks a scrypt hash). */
export async function signInLoadPatients(app: RunningApp, count: number, parallel = 5): Promise<LoadPatient[]> {
  const rows = await sql<{ email: string, patientId: number }>(app,
    `SELECT u.email AS email, p.id AS "patientId" FROM users u JOIN patients p ON p.user_id = u.id
     WHERE u.email LIKE 'load-%@demo.tidewell.test' ORDER BY p.id LIMIT ?`, [count])
  const patients: LoadPatient[] = []
  for (let at = 0; at < rows.length; at += parallel) {
    patients.push(...await Promise.all(rows.slice(at, at + parallel).map(async row => ({ ...row, client: await Client.signIn(app.url, row.email) }))))
  }
  return patients
}

/** A quiet week with a note: the note opens a routine queue item (rule note-to-read). */
export function diaryWithNote(n: number) {
  return { ...diaryEntry({ note: `Load test note ${n}: nothing new, just saying hello.` }), draftId: randomUUID() }
}
