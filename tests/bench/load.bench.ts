import { cpus, loadavg } from 'node:os'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { diaryEntry } from '../support/diary'
import { sql } from '../support/sqlite'
import { table } from './figures'
import type { LoadFigures } from './load-support'
import { addBenchPatients, diaryWrites, load, readerTimings, RUN_S, sessionCookie, signInAll, TIMEOUT_S } from './load-support'

/*
 * Load against the built server on loopback (autocannon 8, runs of RUN_S seconds each, the
 * queue-under-writes run twice that):
 * the floor (a bare route), diary writes by 100 signed-in patients at 1, 10 and 50
 * connections, the nurse's queue read idle and beside 50 writers, the server-rendered
 * Today page and the schedule read. Figures and the aims of issue 10 are printed side by
 * side; nothing here passes or fails on time. The only assertions are about correctness:
 * every acknowledged diary is stored, and the pages measured really answer 200.
 */

const WRITERS = 100
const QUIET = diaryEntry()
// One diary in ten carries a note, which opens a routine queue item (rule note-to-read),
// so the writes include queue items like a real week's do.
const WITH_NOTE = diaryEntry({ note: 'Slept badly two nights, otherwise a usual week.' })
const diaryBody = (n: number) => (n % 10 === 0 ? WITH_NOTE : QUIET)

async function storedEntries(dbPath: string) {
  const [row] = await sql<{ n: number }>(dbPath, 'SELECT COUNT(*) AS n FROM diary_entries')
  return row!.n
}

const ms = (value: number) => value.toFixed(value < 10 ? 1 : 0)
const times = (value: number) => `${value.toFixed(2)}×`

describe('load: the built server under many clients (autocannon, loopback)', () => {
  let app: RunningApp
  let writers: { email: string, cookie: string, patientId: number }[]
  let patient: { cookie: string, patientId: number }
  let nurseCookie: string

  beforeAll(async () => {
    app = await startApp()
    // The demo clinic's patients, and invented ones up to WRITERS.
    const demo = (await sql<{ email: string }>(app, `SELECT email FROM users WHERE role = 'patient' AND active = 1 AND password_hash IS NOT NULL ORDER BY id`)).map(row => row.email)
    const created = await addBenchPatients(app.dbPath, WRITERS - demo.length)
    writers = await signInAll(app.url, [...demo, ...created])
    patient = writers.find(writer => writer.email === 'patient@demo.tidewell.test')!
    nurseCookie = await sessionCookie(app.url, 'nurse@demo.tidewell.test')
  }, 300_000)
  afterAll(() => app?.stop())

  it('prints the floor, diary writes at 1/10/50 connections, the queue under writes, Today and the schedule', async () => {
    expect(writers).toHaveLength(WRITERS)
    expect(new Set(writers.map(writer => writer.patientId)).size).toBe(WRITERS)
    const url = (path: string) => `${app.url}${path}`
    const asPatient = { cookie: patient.cookie }
    const schedulePath = `/api/patients/${patient.patientId}/schedule`

    // What is measured must really answer: a page, not a redirect to sign-in.
    for (const [path, cookie] of [['/today', patient.cookie], [schedulePath, patient.cookie], ['/api/triage', nurseCookie]] as const) {
      const reply = await fetch(url(path), { headers: { cookie }, redirect: 'manual' })
      await reply.arrayBuffer()
      expect(reply.status, path).toBe(200)
    }
    const first = await fetch(url(`/api/patients/${patient.patientId}/diary`), {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'origin': new URL(app.url).origin, 'cookie': patient.cookie },
      body: JSON.stringify({ ...QUIET, draftId: crypto.randomUUID() }),
    })
    await first.arrayBuffer()
    expect(first.status).toBe(201)

    const loadBefore = loadavg()[0]!
    // Warm-up (JIT, statement caches, the SSR renderer), not reported.
    const before = await storedEntries(app.dbPath)
    let acknowledged = 0
    for (const run of [
      { url: url('/api/health') },
      { url: url('/today'), headers: asPatient },
      { url: url(schedulePath), headers: asPatient },
      { url: url('/api/triage'), headers: { cookie: nurseCookie } },
      { url: app.url, next: diaryWrites(app.url, writers, diaryBody) },
    ]) {
      const warm = await load({ label: 'warm-up', connections: 10, seconds: 1, ...run })
      if (run.next) acknowledged += warm.ok
    }

    const floor = await load({ label: 'GET /api/health (the floor)', url: url('/api/health'), connections: 10 })
    const today = await load({ label: 'GET /today (SSR, signed-in patient)', url: url('/today'), connections: 10, headers: asPatient })
    const schedule = await load({ label: 'GET /api/patients/:id/schedule', url: url(schedulePath), connections: 10, headers: asPatient })

    const diary: LoadFigures[] = []
    for (const connections of [1, 10, 50]) {
      diary.push(await load({ label: `POST /api/patients/:id/diary`, url: app.url, connections, next: diaryWrites(app.url, writers, diaryBody) }))
    }

    const queueIdle = await readerTimings(url('/api/triage'), nurseCookie)
    const [underLoad, queueBusy] = await Promise.all([
      load({ label: 'POST diary beside the nurse\'s queue', url: app.url, connections: 50, seconds: 2 * RUN_S, next: diaryWrites(app.url, writers, diaryBody) }),
      readerTimings(url('/api/triage'), nurseCookie, 2 * RUN_S),
    ])
    acknowledged += diary.reduce((sum, run) => sum + run.ok, 0) + underLoad.ok
    const after = await storedEntries(app.dbPath)

    const errors = (run: LoadFigures) => run.non2xx + run.timeouts + run.otherErrors
    const diaryAim = (run: LoadFigures) => {
      if (run.connections === 1) return 'no aim at 1 connection'
      const met = run.okPerSecond >= 300 && errors(run) === 0 && run.p99 < 1000
      return `aim >= 300/s, 0 errors, p99 < 1000 ms: ${met ? 'met' : 'NOT met'}`
    }
    const row = (run: LoadFigures, aim: string) => [
      run.label,
      run.connections,
      run.perSecond.toFixed(0),
      run.okPerSecond.toFixed(0),
      times(run.okPerSecond / floor.okPerSecond),
      ms(run.p50),
      times(run.p50 / Math.max(floor.p50, 1)),
      ms(run.p99),
      times(run.p99 / Math.max(floor.p99, 1)),
      run.non2xx,
      run.timeouts,
      run.otherErrors,
      run.statuses || '-',
      aim,
    ]
    const todayAim = `aim >= 1/5 of the floor (${(floor.okPerSecond / 5).toFixed(0)}/s): ${today.okPerSecond >= floor.okPerSecond / 5 ? 'met' : 'NOT met'}`
    table(`Load on the built server, loopback, ${RUN_S} s per run (${2 * RUN_S} s beside the nurse), request timeout ${TIMEOUT_S} s, ${WRITERS} patients writing in turn, each diary with a fresh draft id`, [
      ['path', 'conn', 'req/s', '2xx/s', 'x floor', 'p50 ms', 'x floor', 'p99 ms', 'x floor', 'non-2xx', 'timeouts', 'socket err', 'statuses', 'aim (issue 10)'],
      row(floor, 'the floor'),
      ...diary.map(run => row(run, diaryAim(run))),
      row(underLoad, diaryAim(underLoad)),
      row(today, todayAim),
      row(schedule, 'no aim (throughput and ratio reported)'),
    ], [
      `conn: connections; errors are non-2xx, timeouts (no answer in ${TIMEOUT_S} s) and socket errors (the request each connection has in flight when a run stops is not counted).`,
      'x floor: 2xx/s divided by the floor\'s 2xx/s; p50 and p99 divided by the floor\'s (latencies in whole ms, as autocannon counts them).',
      `Machine: ${cpus().length} cores (${cpus()[0]?.model.trim()}), Node ${process.version}; autocannon runs in this process beside the server; 1-minute load average ${loadBefore.toFixed(2)} before the runs, ${loadavg()[0]!.toFixed(2)} after (other work on the machine shows here).`,
      `Diary entries acknowledged (2xx, warm-up included): ${acknowledged}; stored during the runs: ${after - before} (entries whose client was cut off at the end of a run may be stored unacknowledged).`,
    ])

    const ratio = queueBusy.p95 / queueIdle.p95
    table('GET /api/triage (the nurse\'s queue, one reader, back to back in its own thread)', [
      ['while', 'reads', 'failed', 'median ms', 'p95 ms', 'aim (issue 10)'],
      ['idle', queueIdle.n, queueIdle.failed, ms(queueIdle.median), ms(queueIdle.p95), ''],
      ['50 diary writers', queueBusy.n, queueBusy.failed, ms(queueBusy.median), ms(queueBusy.p95), `p95 at most 2× idle: ${times(ratio)}, ${ratio <= 2 ? 'met' : 'NOT met'}`],
    ])

    // Correctness, not speed: an acknowledged diary is a stored diary.
    expect(after - before).toBeGreaterThanOrEqual(acknowledged)
    expect(floor.ok).toBeGreaterThan(0)
  })
})
