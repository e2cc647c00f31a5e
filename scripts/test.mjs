// npm test: install what is missing, then run every suite (unit, API, browser) on SQLite, then
// the API suite again on PostgreSQL (a throw-away cluster the tests start: tests/support/postgres.ts).
import { execSync, spawnSync } from 'node:child_process'
import { existsSync, readdirSync, statSync } from 'node:fs'

const root = new URL('..', import.meta.url).pathname
const run = (command, options = {}) => execSync(command, { cwd: root, stdio: 'inherit', ...options })

const stamp = `${root}node_modules/.package-lock.json`
if (!existsSync(stamp) || statSync(stamp).mtimeMs < statSync(`${root}package-lock.json`).mtimeMs) {
  console.log('[tidewell] installing npm packages (npm ci; sqlite3 compiles, about 3 minutes)…')
  run('npm ci --no-audit --no-fund')
}

const chromium = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium'
if (!existsSync(chromium)) {
  if (process.getuid?.() === 0) {
    console.log('[tidewell] installing Debian\'s chromium for the browser tests…')
    run('apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium', { shell: '/bin/bash' })
  }
  else {
    console.log('[tidewell] The browser tests need Debian\'s "chromium" package: sudo apt-get install chromium')
  }
}

const postgresBin = () => existsSync('/usr/lib/postgresql') && readdirSync('/usr/lib/postgresql').some(v => existsSync(`/usr/lib/postgresql/${v}/bin/initdb`))
if (!postgresBin()) {
  if (process.getuid?.() === 0) {
    console.log('[tidewell] installing Debian\'s postgresql for the PostgreSQL pass (no service is started)…')
    // policy-rc.d 101: the package's scripts start no service (the tests start their own cluster).
    const policy = existsSync('/usr/sbin/policy-rc.d') ? '' : 'printf \'#!/bin/sh\\nexit 101\\n\' > /usr/sbin/policy-rc.d && chmod +x /usr/sbin/policy-rc.d && trap \'rm -f /usr/sbin/policy-rc.d\' EXIT && '
    run(`${policy}apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq postgresql`, { shell: '/bin/bash' })
  }
  else {
    console.log('[tidewell] The PostgreSQL pass needs Debian\'s "postgresql" package: sudo apt-get install postgresql')
  }
}

const args = process.argv.slice(2)
const started = Date.now()
const first = spawnSync('npx', ['vitest', 'run', ...args], { cwd: root, stdio: 'inherit' })
if (first.status !== 0 || args.length) process.exit(first.status ?? 1)
console.log(`[tidewell] SQLite pass done in ${Math.round((Date.now() - started) / 1000)} s; now the API suite on PostgreSQL…`)
const pgStarted = Date.now()
const second = spawnSync('npx', ['vitest', 'run', '--project', 'api'], { cwd: root, stdio: 'inherit', env: { ...process.env, TIDEWELL_DB: 'postgres', TIDEWELL_SKIP_BUILD: '1' } })
console.log(`[tidewell] PostgreSQL pass done in ${Math.round((Date.now() - pgStarted) / 1000)} s`)
process.exit(second.status ?? 1)
