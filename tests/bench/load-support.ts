import { randomUUID } from 'node:crypto'
import { Worker } from 'node:worker_threads'
import autocannon from 'autocannon'
import type { AutocannonRequest } from 'autocannon'
import { DEMO_PASSWORD, totpCode } from '../support/client'
import { sql } from '../support/sqlite'
import { percentiles } from './figures'

/**
 * Every run is this long (seconds) unless told otherwise. A request waiting longer than
 * TIMEOUT_S counts as a timeout (shorter than a run, so a hang shows as one; the one
 * request per connection still in flight when a run stops is not counted).
 */
export const RUN_S = 5
export const TIMEOUT_S = 3

export interface LoadFigures {
  label: string
  connections: number
  seconds: number
  /** Responses of any status per second. */
  perSecond: number
  /** 2xx responses per second (what the client got done). */
  okPerSecond: number
  ok: number
  p50: number
  p99: number
  non2xx: number
  timeouts: number
  /** Socket errors other than timeouts (resets, refused). */
  otherErrors: number
  /** Status codes other than 2xx, e.g. "503×12". */
  statuses: string
}

function assertLoopback(url: string) {
  const { hostname } = new URL(url)
  if (hostname !== '127.0.0.1' && hostname !== 'localhost' && hostname !== '[::1]') {
    throw new Error(`load runs only against loopback, not ${hostname}`)
  }
}

/**
 * One bounded autocannon run against the built server. `url` holds the full path (autocannon
 * 8 ignores a separate path option); `next()` may give each request its own method, path,
 * headers and body. Stops at `seconds`, and in any case a few seconds after that.
 */
export async function load(options: {
  label: string
  url: string
  connections: number
  seconds?: number
  headers?: Record<string, string>
  next?: () => AutocannonRequest
}): Promise<LoadFigures> {
  assertLoopback(options.url)
  const seconds = options.seconds ?? RUN_S
  const requests = options.next
    ? [{ setupRequest: (request: AutocannonRequest) => {
        const own = options.next!()
        return { ...request, ...own, headers: { ...request.headers, ...own.headers } }
      } }]
    : undefined
  const instance = autocannon({ url: options.url, connections: options.connections, duration: seconds, timeout: TIMEOUT_S, headers: options.headers, requests })
  const guard = setTimeout(() => instance.stop(), (seconds + TIMEOUT_S + 2) * 1000)
  try {
    const result = await instance
    const ok = result['2xx']
    return {
      label: options.label,
      connections: options.connections,
      seconds: result.duration,
      perSecond: result.requests.total / result.duration,
      okPerSecond: ok / result.duration,
      ok,
      p50: result.latency.p50,
      p99: result.latency.p99,
      non2xx: result.non2xx,
      timeouts: result.timeouts,
      otherErrors: result.errors - result.timeouts,
      statuses: Object.entries(result.statusCodeStats).filter(([code]) => !code.startsWith('2')).map(([code, { count }]) => `${code}×${count}`).join(' '),
    }
  }
  finally {
    clearTimeout(guard)
  }
}

/** The session cookie of a signed-in user, as a `cookie` header value. */
export async function sessionCookie(baseUrl: string, email: string, password = DEMO_PASSWORD): Promise<string> {
  const response = await fetch(new URL('/api/auth/sign-in', baseUrl), {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'origin': new URL(baseUrl).origin },
    body: JSON.stringify({ email, password }),
  })
  const body = await response.json().catch(() => ({}))
  if (response.status !== 200) throw new Error(`sign-in for ${email} answered ${response.status}`)
  const cookie = response.headers.getSetCookie().map(line => line.split(';')[0]).join('; ')
  if (!body.secondFactor) return cookie
  // Staff: the code from the demo secret completes the sign-in with a new session cookie.
  const second = await fetch(new URL('/api/auth/totp/verify', baseUrl), {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'origin': new URL(baseUrl).origin, cookie },
    body: JSON.stringify({ code: await totpCode(baseUrl, email) }),
  })
  await second.text()
  if (second.status !== 200) throw new Error(`second factor for ${email} answered ${second.status}`)
  return second.headers.getSetCookie().map(line => line.split(';')[0]).join('; ')
}

/**
 * Adds `count` patients to the database of a running test server (invented names, the demo
 * password: the hash is copied from the demo patient, so no scrypt runs here). Returns their e-mails.
 */
export async function addBenchPatients(dbPath: string, count: number): Promise<string[]> {
  const emails = Array.from({ length: count }, (_, i) => `load${i + 1}@bench.tidewell.test`)
  await sql(dbPath, `WITH RECURSIVE n(i) AS (SELECT 1 UNION ALL SELECT i + 1 FROM n WHERE i < ${count})
    INSERT INTO users (email, password_hash, role, name, language, active, created_at, updated_at)
    SELECT 'load' || i || '@bench.tidewell.test', (SELECT password_hash FROM users WHERE email = 'patient@demo.tidewell.test'),
      'patient', 'Load Patient ' || i, 'en', 1, strftime('%Y-%m-%d %H:%M:%f +00:00', 'now'), strftime('%Y-%m-%d %H:%M:%f +00:00', 'now') FROM n`)
  await sql(dbPath, `INSERT INTO patients (user_id, clinic_number, date_of_birth, created_at, updated_at)
    SELECT id, 'LOAD-' || id, '1952-06-01', created_at, updated_at FROM users WHERE email LIKE 'load%@bench.tidewell.test'`)
  return emails
}

/** Signs everyone in, a few at a time (scrypt is slow on purpose), and gives each his cookie and patient id. */
export async function signInAll(baseUrl: string, emails: string[]): Promise<{ email: string, cookie: string, patientId: number }[]> {
  const people: { email: string, cookie: string, patientId: number }[] = []
  for (let i = 0; i < emails.length; i += 4) {
    people.push(...await Promise.all(emails.slice(i, i + 4).map(async (email) => {
      const cookie = await sessionCookie(baseUrl, email)
      const session = await fetch(new URL('/api/_auth/session', baseUrl), { headers: { cookie } }).then(r => r.json()) as { user: { patientId: number } }
      return { email, cookie, patientId: session.user.patientId }
    })))
  }
  return people
}

/**
 * Requests that each send a whole diary with a fresh draft id, taking the writers in turn,
 * with the Origin a browser on `baseUrl` sends (server/middleware/01.request-guard.ts).
 */
export function diaryWrites(baseUrl: string, writers: { cookie: string, patientId: number }[], body: (n: number) => object): () => AutocannonRequest {
  const origin = new URL(baseUrl).origin
  let n = 0
  return () => {
    const writer = writers[n % writers.length]!
    const request = {
      method: 'POST',
      path: `/api/patients/${writer.patientId}/diary`,
      headers: { 'content-type': 'application/json', 'origin': origin, 'cookie': writer.cookie },
      body: JSON.stringify({ ...body(n), draftId: randomUUID() }),
    }
    n++
    return request
  }
}

/*
 * One reader (the nurse refreshing her queue) in a worker thread of its own, so its
 * timings are not held up by autocannon's clients in the main thread: GET after GET for
 * `seconds`, milliseconds per answer, and how many did not answer 200.
 */
const READER = `
const { parentPort, workerData } = require('node:worker_threads')
;(async () => {
  const { url, cookie, seconds } = workerData
  const samples = []
  let failed = 0
  const end = Date.now() + seconds * 1000
  while (Date.now() < end) {
    const start = performance.now()
    try {
      const response = await fetch(url, { headers: { cookie }, signal: AbortSignal.timeout(${TIMEOUT_S * 1000}) })
      await response.arrayBuffer()
      if (response.status !== 200) failed++
    }
    catch { failed++ }
    samples.push(performance.now() - start)
  }
  parentPort.postMessage({ samples, failed })
})()
`

export async function readerTimings(url: string, cookie: string, seconds = RUN_S): Promise<{ median: number, p95: number, n: number, failed: number }> {
  assertLoopback(url)
  const worker = new Worker(READER, { eval: true, workerData: { url, cookie, seconds } })
  try {
    const { samples, failed } = await new Promise<{ samples: number[], failed: number }>((done, fail) => {
      worker.once('message', done)
      worker.once('error', fail)
    })
    return { ...percentiles(samples), failed }
  }
  finally {
    await worker.terminate()
  }
}
