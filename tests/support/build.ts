import { spawn } from 'node:child_process'
import { existsSync } from 'node:fs'

const root = new URL('../../', import.meta.url).pathname
const shared = globalThis as typeof globalThis & { tidewellBuild?: Promise<void> }

/**
 * Builds the app once per test run (both the API and the browser project call this; the
 * second call reuses the first). TIDEWELL_SKIP_BUILD=1 reuses an existing .output.
 */
export function buildOnce(): Promise<void> {
  shared.tidewellBuild ??= (async () => {
    if (process.env.TIDEWELL_SKIP_BUILD === '1' && existsSync(`${root}.output/server/index.mjs`)) return
    const started = Date.now()
    await new Promise<void>((done, fail) => {
      const child = spawn('npx', ['nuxt', 'build'], { cwd: root, stdio: ['ignore', 'ignore', 'pipe'], env: { ...process.env, NODE_ENV: 'production' } })
      let errors = ''
      child.stderr.on('data', (chunk) => {
        errors += chunk
      })
      child.on('exit', code => (code === 0 ? done() : fail(new Error(`nuxt build failed (${code}):\n${errors.slice(-4000)}`))))
    })
    console.log(`[tests] built the app in ${((Date.now() - started) / 1000).toFixed(0)} s`)
  })()
  return shared.tidewellBuild
}
