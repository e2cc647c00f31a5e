// npm test: install what is missing, then run every suite (unit, API, browser).
import { execSync, spawnSync } from 'node:child_process'
import { existsSync, statSync } from 'node:fs'

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

const result = spawnSync('npx', ['vitest', 'run', ...process.argv.slice(2)], { cwd: root, stdio: 'inherit' })
process.exit(result.status ?? 1)
