// npm run demo: install if needed, build, then serve the demo clinic on http://localhost:3000
// with its SQLite file in data/ (created, migrated and seeded once by the server itself)
// and the local mail catcher.
import { execSync, spawn } from 'node:child_process'
import { existsSync, mkdirSync, statSync } from 'node:fs'

const root = new URL('..', import.meta.url).pathname
// The demo staff's second-factor secret (DEMO_TOTP_SECRET in server/db/seed/demo.ts).
const DEMO_TOTP_SECRET = 'TIDEWELLDEMOSTAFFTOTPSECRETKEY23'

// npm run demo -- --code: print the demo staff's current code and stop.
if (process.argv.includes('--code')) {
  const { generate } = await import('otplib')
  console.log(await generate({ secret: DEMO_TOTP_SECRET }))
  process.exit(0)
}
const run = command => execSync(command, { cwd: root, stdio: 'inherit' })
const port = process.env.PORT ?? '3000'
const url = `http://localhost:${port}`

const stamp = `${root}node_modules/.package-lock.json`
if (!existsSync(stamp) || statSync(stamp).mtimeMs < statSync(`${root}package-lock.json`).mtimeMs) {
  console.log('[tidewell] installing npm packages (npm ci; sqlite3 compiles, about 3 minutes)…')
  run('npm ci --no-audit --no-fund')
}
console.log('[tidewell] building…')
run('npx nuxt build')
mkdirSync(`${root}data`, { recursive: true })

const server = spawn(process.execPath, ['.output/server/index.mjs'], {
  cwd: root,
  stdio: 'inherit',
  env: {
    NUXT_SEED_DEMO: 'true',
    NUXT_SEED_DEMO_ACTIVITY: 'true',
    NUXT_PUBLIC_URL: url,
    ...process.env,
    PORT: port,
  },
})
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => server.kill(signal))
server.on('exit', code => process.exit(code ?? 0))

for (let i = 0; i < 120; i++) {
  const ok = await fetch(`${url}/api/health`).then(r => r.ok).catch(() => false)
  if (ok) break
  await new Promise(r => setTimeout(r, 500))
}
console.log(`
  Tidewell demo: ${url}

  Sign in with password "tidewell-demo" as:
    patient@demo.tidewell.test     Elias Marwood, a patient
    caregiver@demo.tidewell.test   Marisol Marwood, his wife (care circle)
    nurse@demo.tidewell.test       Nora Lindqvist, nurse
    clinician@demo.tidewell.test   Ines Varga, clinician
    admin@demo.tidewell.test       Priya Castellanos, administrator (Mail catcher page)

  Nurse, clinician and admin then give a code from an authenticator app (a second factor).
  The demo staff share this secret; add it to the app by hand (time-based, 6 digits, 30 s):
    ${DEMO_TOTP_SECRET}
  or print the current code with: npm run demo -- --code

  Data: data/tidewell.sqlite. Stop with Ctrl+C.
`)
