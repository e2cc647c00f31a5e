import type { ChildProcess } from 'node:child_process'
import { spawn } from 'node:child_process'
import { chownSync, existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { freePort } from './ports'
import { createDatabase, onPostgres } from './postgres'

const root = new URL('../../', import.meta.url).pathname

export interface RunningApp {
  url: string
  dbPath: string
  /** On PostgreSQL (TIDEWELL_DB=postgres): the app's own database; undefined on SQLite. */
  databaseUrl?: string
  dataDir: string
  /** The server's process id. */
  pid: number
  /** Kills the server at once (SIGKILL, like a power cut) and waits for it to go; the data stays. */
  crash: () => Promise<void>
  /** Stops the server; its data folder is removed unless keepData (or it was given). */
  stop: (options?: { keepData?: boolean }) => Promise<void>
}

/**
 * The database of the app that keeps its data in `dataDir`: on PostgreSQL a new database
 * in the tests' cluster, named in the folder (postgres-url) so that a restart on the same
 * folder finds the same data, as it finds the same SQLite file.
 */
async function databaseOf(dataDir: string, given?: string | null): Promise<string | undefined> {
  if (given) return given
  if (!onPostgres || given === null) return undefined
  const file = join(dataDir, 'postgres-url')
  if (existsSync(file)) return readFileSync(file, 'utf8').trim()
  const url = await createDatabase()
  writeFileSync(file, url)
  return url
}

/**
 * Starts the built server (.output) with a fresh SQLite file (on PostgreSQL, a fresh
 * database), the demo clinic seeded and e-mail going to the given SMTP URL (or to the app's
 * own mail catcher when none is given). Several apps on one database: give them the same
 * `databaseUrl`; `databaseUrl: null` keeps the app on its SQLite file on PostgreSQL too.
 */
export async function startApp(options: { smtpUrl?: string, env?: Record<string, string>, dataDir?: string, databaseUrl?: string | null, user?: { uid: number, gid: number } } = {}): Promise<RunningApp> {
  const port = await freePort()
  const dataDir = options.dataDir ?? mkdtempSync(join(tmpdir(), 'tidewell-test-'))
  const dbPath = join(dataDir, 'tidewell.sqlite')
  const databaseUrl = await databaseOf(dataDir, options.databaseUrl)
  const url = `http://127.0.0.1:${port}`
  // With a user (tests that need file permissions to hold when the tests run as root),
  // the server runs as that user and owns its data folder.
  if (options.user) chownSync(dataDir, options.user.uid, options.user.gid)
  const child: ChildProcess = spawn(process.execPath, [`${root}.output/server/index.mjs`], {
    cwd: root,
    ...options.user,
    stdio: ['ignore', 'pipe', 'pipe'],
    env: {
      ...process.env,
      NODE_ENV: 'production',
      PORT: String(port),
      HOST: '127.0.0.1',
      NUXT_DATABASE_PATH: dbPath,
      NUXT_DATABASE_URL: databaseUrl ?? '',
      NUXT_SEED_DEMO: 'true',
      NUXT_SESSION_PASSWORD: 'test-session-password-at-least-32-characters-long',
      NUXT_PUBLIC_URL: url,
      NUXT_SMTP_URL: options.smtpUrl ?? '',
      NUXT_MAIL_CATCHER_PORT: String(await freePort()),
      NUXT_OUTBOX_POLL_MS: '200',
      NUXT_OUTBOX_RETRY_BASE_MS: '200',
      NUXT_ALLOW_CLOCK_OVERRIDE: 'true',
      ...options.env,
    },
  })
  let output = ''
  child.stdout?.on('data', (chunk) => {
    output += chunk
  })
  child.stderr?.on('data', (chunk) => {
    output += chunk
  })
  const deadline = Date.now() + 30_000
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server exited early:\n${output}`)
    const ready = await fetch(`${url}/api/health`).then(r => r.ok).catch(() => false)
    if (ready) break
    if (Date.now() > deadline) throw new Error(`server did not start:\n${output}`)
    await new Promise(r => setTimeout(r, 150))
  }
  return {
    url,
    dbPath,
    databaseUrl,
    dataDir,
    pid: child.pid!,
    crash: async () => {
      if (child.exitCode !== null || child.signalCode !== null) return
      const exited = new Promise(done => child.once('exit', done))
      child.kill('SIGKILL')
      await exited
    },
    stop: async ({ keepData = false } = {}) => {
      if (child.exitCode === null && child.signalCode === null) {
        const exited = new Promise(done => child.once('exit', done))
        child.kill('SIGTERM')
        await exited
      }
      if (!options.dataDir && !keepData) rmSync(dataDir, { recursive: true, force: true })
    },
  }
}
