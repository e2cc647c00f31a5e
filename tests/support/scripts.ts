import { spawn } from 'node:child_process'

const root = new URL('../../', import.meta.url).pathname

/** Runs one of scripts/ (npm run backup, restore, db:move) with the given settings; its exit code and output. */
export function runScript(script: string, args: string[], env: Record<string, string>): Promise<{ code: number | null, out: string }> {
  return new Promise((done) => {
    const child = spawn(process.execPath, [`${root}scripts/${script}`, ...args], {
      cwd: root,
      env: { ...process.env, ...env },
      stdio: ['ignore', 'pipe', 'pipe'],
    })
    let out = ''
    child.stdout.on('data', (chunk) => {
      out += chunk
    })
    child.stderr.on('data', (chunk) => {
      out += chunk
    })
    child.on('exit', code => done({ code, out }))
  })
}
