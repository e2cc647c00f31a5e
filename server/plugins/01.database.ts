import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { dirname, join, resolve } from 'node:path'

/**
 * Start-up: make sure sessions can be sealed, then open the database, apply migrations
 * (and seed the demo clinic when asked) before the first request needs them.
 */
export default defineNitroPlugin(() => {
  const config = useRuntimeConfig()
  if (!process.env.NUXT_SESSION_PASSWORD && !config.session.password) {
    // No secret configured: keep a random one beside the database so sign-ins survive a restart.
    const file = join(dirname(resolve(config.databasePath)), '.session-secret')
    mkdirSync(dirname(file), { recursive: true })
    if (!existsSync(file)) writeFileSync(file, randomBytes(32).toString('hex'), { mode: 0o600 })
    process.env.NUXT_SESSION_PASSWORD = readFileSync(file, 'utf8').trim()
  }
  whenSeeded().catch((error) => {
    console.error('[tidewell] database start-up failed', error)
  })
})
