// npm run bench: build once, then print throughput and latency figures (never pass/fail on time).
import { spawnSync } from 'node:child_process'

const root = new URL('..', import.meta.url).pathname
const result = spawnSync('npx', ['vitest', 'run', '--project', 'bench', ...process.argv.slice(2)], {
  cwd: root,
  stdio: 'inherit',
  env: { ...process.env, TIDEWELL_BENCH: '1' },
})
process.exit(result.status ?? 1)
