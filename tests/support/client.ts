import { readFileSync, renameSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { generate } from 'otplib'

export const DEMO_PASSWORD = 'tidewell-demo'
/** The demo staff's second-factor secret (DEMO_TOTP_SECRET in server/db/seed/demo.ts). */
export const DEMO_TOTP_SECRET = 'TIDEWELLDEMOSTAFFTOTPSECRETKEY23'

const usedSteps = new Map<string, number>()

// Test files run in workers of their own, and the browser tests share one server: the steps
// used on a server (by its address) are kept in a file too, so a second file signing the same
// nurse in within 30 s does not send a code the server already took.
const STEPS_FILE = join(tmpdir(), 'tidewell-test-totp-steps.json')
function stepsOnFile(): Record<string, number> {
  try {
    return JSON.parse(readFileSync(STEPS_FILE, 'utf8')) as Record<string, number>
  }
  catch {
    return {}
  }
}
function keepStepOnFile(key: string, step: number) {
  const steps = stepsOnFile()
  steps[key] = Math.max(steps[key] ?? -Infinity, step)
  const temporary = `${STEPS_FILE}.${process.pid}`
  writeFileSync(temporary, JSON.stringify(steps))
  renameSync(temporary, STEPS_FILE)
}

/**
 * A code from `secret` for a time step not yet used by this user on this server: the server
 * accepts each step once and the steps before, at and after now (server/utils/auth/totp.ts), so
 * three sign-ins of one user per 30 s go straight through and a fourth waits for the next step.
 */
export async function totpCode(baseUrl: string, email: string, secret = DEMO_TOTP_SECRET): Promise<string> {
  // Host without port: a test may restart a server on the same database at another port.
  const key = `${new URL(baseUrl).hostname} ${email}`
  const serverKey = `${new URL(baseUrl).origin} ${email}`
  for (;;) {
    const now = Date.now() / 1000
    const current = Math.floor(now / 30)
    const lastUsed = Math.max(usedSteps.get(key) ?? -Infinity, stepsOnFile()[serverKey] ?? -Infinity)
    let step = Math.max(current - 1, lastUsed + 1)
    // The step before now stops being accepted when the next step starts: not near its end.
    if (step === current - 1 && now - current * 30 > 25) step = current
    if (step <= current + 1) {
      usedSteps.set(key, step)
      keepStepOnFile(serverKey, step)
      return generate({ secret, epoch: step * 30 })
    }
    await new Promise(resolve => setTimeout(resolve, ((step - 1) * 30 - now) * 1000 + 100))
  }
}

export interface Reply<T = any> { // eslint-disable-line @typescript-eslint/no-explicit-any
  status: number
  headers: Headers
  body: T
}

/** A tiny HTTP client that keeps the session cookie, like a browser would. */
export class Client {
  private cookies = new Map<string, string>()

  constructor(readonly baseUrl: string) {}

  static async signIn(baseUrl: string, email: string, password = DEMO_PASSWORD): Promise<Client> {
    const client = new Client(baseUrl)
    const reply = await client.post('/api/auth/sign-in', { email, password })
    if (reply.status !== 200) throw new Error(`sign-in for ${email} answered ${reply.status}`)
    // Staff give a code next (the demo staff share DEMO_TOTP_SECRET).
    if (reply.body.secondFactor === 'verify') {
      const second = await client.post('/api/auth/totp/verify', { code: await totpCode(baseUrl, email) })
      if (second.status !== 200) throw new Error(`second factor for ${email} answered ${second.status}`)
    }
    else if (reply.body.secondFactor) throw new Error(`${email} must enrol a second factor first`)
    return client
  }

  /**
   * Sends like a browser on a Tidewell page: JSON, and on every non-GET request an Origin of
   * the server's own (server/middleware/01.request-guard.ts refuses others); `headers` may
   * override either.
   */
  async request(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Reply> {
    const response = await fetch(new URL(path, this.baseUrl), {
      method,
      headers: {
        ...(method === 'GET' || method === 'HEAD' ? {} : { origin: new URL(this.baseUrl).origin }),
        ...(body === undefined ? {} : { 'content-type': 'application/json' }),
        ...(this.cookies.size ? { cookie: this.cookieHeader() } : {}),
        ...headers,
      },
      body: body === undefined ? undefined : JSON.stringify(body),
      redirect: 'manual',
    })
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';')
      const [name, ...value] = pair!.split('=')
      if (/max-age=0|expires=thu, 01 jan 1970/i.test(line)) this.cookies.delete(name!.trim())
      else this.cookies.set(name!.trim(), value.join('='))
    }
    const text = await response.text()
    let parsed: unknown = text
    if ((response.headers.get('content-type') ?? '').includes('json') && text) parsed = JSON.parse(text)
    return { status: response.status, headers: response.headers, body: parsed }
  }

  /** The same session (its cookies, copied) sent to another server, e.g. a second instance. */
  on(baseUrl: string): Client {
    const other = new Client(baseUrl)
    for (const [name, value] of this.cookies) other.cookies.set(name, value)
    return other
  }

  /** The session cookie as a `cookie` header value, for a test that sends a request by hand. */
  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
  }

  get(path: string) {
    return this.request('GET', path)
  }

  post(path: string, body: unknown = {}) {
    return this.request('POST', path, body)
  }

  put(path: string, body: unknown) {
    return this.request('PUT', path, body)
  }

  patch(path: string, body: unknown) {
    return this.request('PATCH', path, body)
  }

  delete(path: string) {
    return this.request('DELETE', path)
  }
}
