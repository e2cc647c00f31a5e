import { execFileSync, spawnSync } from 'node:child_process'
import { chownSync, existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import pg from 'pg'
import { freePort } from './ports'

/*
 * A throw-away PostgreSQL cluster for the tests (TIDEWELL_DB=postgres): Debian's
 * postgresql package, initdb and pg_ctl under a temporary folder, on a free loopback port,
 * no system service. Each started app gets its own database in it (createDatabase).
 */

/** The database the tests run on: TIDEWELL_DB=postgres, or SQLite (the default). */
export const onPostgres = process.env.TIDEWELL_DB === 'postgres'

/** Says in the test output why a part is skipped on PostgreSQL (call it beside describe.skipIf(onPostgres)). */
export function skippedOnPostgres(what: string, reason: string) {
  if (onPostgres) console.log(`[tests] ${what} skipped on PostgreSQL: ${reason}`)
}

/** Where the global setup's cluster listens (an admin URL without a database name). */
export const CLUSTER_ENV = 'TIDEWELL_PG_CLUSTER_URL'

export function postgresBin(): string {
  const base = '/usr/lib/postgresql'
  const majors = existsSync(base) ? readdirSync(base).filter(v => existsSync(join(base, v, 'bin', 'initdb'))).sort((a, b) => Number(b) - Number(a)) : []
  if (!majors.length) throw new Error('PostgreSQL tests need Debian\'s "postgresql" package (/usr/lib/postgresql/<version>/bin/initdb): apt-get install postgresql')
  return join(base, majors[0]!, 'bin')
}

export interface Cluster {
  /** postgres://…@127.0.0.1:<port> (add /<database>). */
  url: string
  stop: () => void
}

/** Starts a cluster under a new temporary folder; initdb refuses root, so as root it runs as user postgres. */
export async function startCluster(): Promise<Cluster> {
  const bin = postgresBin()
  const dir = mkdtempSync(join(tmpdir(), 'tidewell-pg-'))
  const asRoot = process.getuid?.() === 0
  const run = (command: string, args: string[]) => {
    const [file, argv] = asRoot ? ['runuser', ['-u', 'postgres', '--', command, ...args]] : [command, args]
    const result = spawnSync(file, argv, { cwd: dir, encoding: 'utf8' })
    if (result.status !== 0) throw new Error(`${command} failed:\n${result.stdout}\n${result.stderr}`)
  }
  if (asRoot) chownSync(dir, Number(execFileSync('id', ['-u', 'postgres'], { encoding: 'utf8' })), Number(execFileSync('id', ['-g', 'postgres'], { encoding: 'utf8' })))
  const data = join(dir, 'data')
  const port = await freePort()
  run(join(bin, 'initdb'), ['-D', data, '-U', 'tidewell', '-A', 'trust', '--no-sync', '-E', 'UTF8', '--locale=C'])
  // fsync off: a test cluster is thrown away, and a crash test kills the app, never the cluster.
  const options = `-p ${port} -k ${dir} -c listen_addresses=127.0.0.1 -c fsync=off -c synchronous_commit=off -c full_page_writes=off -c max_connections=300`
  run(join(bin, 'pg_ctl'), ['-D', data, '-o', options, '-l', join(dir, 'log'), '-w', 'start'])
  return {
    url: `postgres://tidewell@127.0.0.1:${port}`,
    stop: () => {
      try {
        run(join(bin, 'pg_ctl'), ['-D', data, '-m', 'immediate', '-w', 'stop'])
      }
      finally {
        rmSync(dir, { recursive: true, force: true })
      }
    },
  }
}

/** Makes a new, empty database in the tests' cluster; returns its URL. */
export async function createDatabase(clusterUrl = process.env[CLUSTER_ENV]): Promise<string> {
  if (!clusterUrl) throw new Error(`TIDEWELL_DB=postgres but no cluster (${CLUSTER_ENV}): run through the api project's global setup`)
  const name = `tidewell_${process.pid}_${Date.now().toString(36)}_${Math.random().toString(36).slice(2, 8)}`
  const client = new pg.Client({ connectionString: `${clusterUrl}/postgres` })
  await client.connect()
  try {
    await client.query(`CREATE DATABASE ${name}`)
  }
  finally {
    await client.end()
  }
  return `${clusterUrl}/${name}`
}
