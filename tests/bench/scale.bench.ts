import { cpus, loadavg } from 'node:os'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { diaryEntry } from '../support/diary'
import { addLoadPatients } from '../support/load'
import type { Cluster } from '../support/postgres'
import { CLUSTER_ENV, createDatabase, postgresBin, startCluster } from '../support/postgres'
import { sql } from '../support/sqlite'
import { table } from './figures'
import type { LoadFigures } from './load-support'
import { diaryWrites, load, RUN_S, signInAll } from './load-support'

/*
 * Issue 14: diary throughput on SQLite (one instance, the in-process write line), on
 * PostgreSQL with one instance, and with two instances on the same database (each writer
 * transaction takes the database's writer lock). 50 connections in every case, split
 * 25/25 over the two instances. Printed, never asserted on time; the one assertion is that
 * every acknowledged diary is stored.
 */

const WRITERS = 100
const CONNECTIONS = 50
const body = (n: number) => diaryEntry(n % 10 === 0 ? { note: 'Slept badly two nights, otherwise a usual week.' } : {})

let cluster: Cluster | undefined
const running: RunningApp[] = []

beforeAll(async () => {
  postgresBin()
  if (!process.env[CLUSTER_ENV]) {
    cluster = await startCluster()
    process.env[CLUSTER_ENV] = cluster.url
  }
}, 60_000)

afterAll(async () => {
  await Promise.all(running.map(app => app.stop()))
  if (cluster) {
    cluster.stop()
    Reflect.deleteProperty(process.env, CLUSTER_ENV)
  }
})

/** Starts `instances` servers on one database (SQLite: one server on its file) with WRITERS patients signed in on each. */
async function setUp(database: 'sqlite' | 'postgres', instances: number) {
  const databaseUrl = database === 'postgres' ? await createDatabase() : null
  const first = await startApp({ databaseUrl })
  running.push(first)
  await addLoadPatients(first, WRITERS)
  const apps = [first]
  for (let n = 1; n < instances; n++) {
    const app = await startApp({ databaseUrl })
    running.push(app)
    apps.push(app)
  }
  const emails = Array.from({ length: WRITERS }, (_, n) => `load-${n + 1}@demo.tidewell.test`)
  const writers = await signInAll(first.url, emails)
  return { apps, writers }
}

const stored = async (app: RunningApp) => (await sql<{ n: number }>(app, 'SELECT COUNT(*) AS n FROM diary_entries'))[0]!.n

/** Diary writes spread over the instances (the writers split between them), summed. */
async function measure(label: string, apps: RunningApp[], writers: { cookie: string, patientId: number }[]) {
  const share = Math.ceil(writers.length / apps.length)
  const run = (seconds: number) => Promise.all(apps.map((app, n) => load({
    label,
    url: app.url,
    connections: CONNECTIONS / apps.length,
    seconds,
    next: diaryWrites(app.url, writers.slice(n * share, (n + 1) * share), body),
  })))
  await run(1)
  const before = await stored(apps[0]!)
  const runs = await run(RUN_S)
  const after = await stored(apps[0]!)
  const sum = (pick: (f: LoadFigures) => number) => runs.reduce((total, figures) => total + pick(figures), 0)
  return {
    label,
    instances: apps.length,
    okPerSecond: sum(f => f.okPerSecond),
    p50: Math.max(...runs.map(f => f.p50)),
    p99: Math.max(...runs.map(f => f.p99)),
    errors: sum(f => f.non2xx + f.timeouts + f.otherErrors),
    statuses: runs.map(f => f.statuses).filter(Boolean).join(' ') || '-',
    acknowledged: sum(f => f.ok),
    storedDuring: after - before,
  }
}

describe('scale: diary writes on SQLite, on PostgreSQL, on two instances', () => {
  it('prints diary throughput for each', async () => {
    const loadBefore = loadavg()[0]!
    const results = []
    for (const [label, database, instances] of [
      ['SQLite, one instance', 'sqlite', 1],
      ['PostgreSQL, one instance', 'postgres', 1],
      ['PostgreSQL, two instances', 'postgres', 2],
    ] as const) {
      const { apps, writers } = await setUp(database, instances)
      results.push(await measure(label, apps, writers))
      await Promise.all(apps.map(app => app.stop()))
    }
    table(`POST /api/patients/:id/diary, ${CONNECTIONS} connections in all, ${RUN_S} s, ${WRITERS} patients writing in turn (one diary in ten with a note, which opens a queue item)`, [
      ['database', 'instances', '2xx/s', 'p50 ms', 'p99 ms', 'errors', 'statuses', 'acknowledged', 'stored'],
      ...results.map(r => [r.label, r.instances, r.okPerSecond.toFixed(0), r.p50, r.p99, r.errors, r.statuses, r.acknowledged, r.storedDuring]),
    ], [
      `Machine: ${cpus().length} cores (${cpus()[0]?.model.trim()}), Node ${process.version}; the instances, PostgreSQL (fsync off: a throw-away cluster) and autocannon share them; 1-minute load average ${loadBefore.toFixed(2)} before, ${loadavg()[0]!.toFixed(2)} after.`,
      'p50 and p99: the slower instance\'s. Two instances on one machine share its cores: the figure shows the writer lock holds across instances, not what a second machine adds.',
    ])
    for (const r of results) expect(r.storedDuring, r.label).toBeGreaterThanOrEqual(r.acknowledged)
  })
})
