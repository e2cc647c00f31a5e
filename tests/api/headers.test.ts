import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'

/*
 * Security headers (issue 11), one test per kind of response, through the built server:
 * nuxt-security (nuxt.config.ts) and server/plugins/09.security-headers.ts.
 *
 * OWASP ASVS 4.0.3 items these pin down (numbers and wording from memory, not checked
 * against the standard's text):
 * - V14.4.3 a Content-Security-Policy that helps against XSS (nonces, no 'unsafe-inline' script)
 * - V14.4.4 X-Content-Type-Options: nosniff on every response
 * - V14.4.5 Strict-Transport-Security on every response (here: when the public URL is https)
 * - V14.4.6 a suitable Referrer-Policy
 * - V14.4.7 content not embeddable in other sites (frame-ancestors, X-Frame-Options)
 * - V14.3.3 headers do not tell which server or framework answers (no X-Powered-By)
 * - V8.2.1 sensitive data not kept in browser or proxy caches (Cache-Control: no-store)
 */

let app: RunningApp
let elias: Client
let eliasId: number
let eliasAppointmentId: number

beforeAll(async () => {
  app = await startApp()
  const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
  const patients = (await nurse.get('/api/patients')).body as { id: number, clinicNumber: string }[]
  eliasId = patients.find(p => p.clinicNumber === 'LPU-1001')!.id
  elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
  eliasAppointmentId = (await elias.get(`/api/patients/${eliasId}/schedule`)).body.nextAppointment.id
})
afterAll(async () => {
  await app?.stop()
})

/** The Content-Security-Policy as directive -> sources. */
function csp(headers: Headers): Map<string, string[]> {
  const value = headers.get('content-security-policy')
  expect(value, 'a Content-Security-Policy header').toBeTruthy()
  return new Map(value!.split(';').map(d => d.trim()).filter(Boolean).map((d) => {
    const [name, ...sources] = d.split(/\s+/)
    return [name!, sources]
  }))
}

/** Headers every response carries, whatever its kind. */
function expectEveryResponseHeaders(headers: Headers) {
  expect(headers.get('x-content-type-options')).toBe('nosniff')
  expect(headers.get('x-frame-options')).toBe('DENY')
  expect(headers.get('referrer-policy')).toBe('no-referrer')
  expect(headers.get('x-powered-by')).toBeNull()
}

/** The page's CSP holds the nonce of every script and stylesheet tag in it, and no way around it. */
function expectPagePolicy(reply: { headers: Headers, body: string }) {
  const policy = csp(reply.headers)
  const scriptSrc = policy.get('script-src')!
  expect(scriptSrc).toContain("'self'")
  expect(scriptSrc).toContain("'strict-dynamic'")
  expect(scriptSrc).not.toContain("'unsafe-inline'")
  expect(scriptSrc).not.toContain("'unsafe-eval'")
  const nonces = scriptSrc.filter(s => s.startsWith("'nonce-"))
  expect(nonces).toHaveLength(1)
  const nonce = /^'nonce-(.+)'$/.exec(nonces[0]!)![1]!
  expect(nonce.length).toBeGreaterThanOrEqual(16)

  const scripts = [...reply.body.matchAll(/<script\b[^>]*>/g)].map(m => m[0])
  expect(scripts.length, 'the page has script tags').toBeGreaterThan(0)
  for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`)
  expect(reply.body, 'the entry script carries the nonce').toMatch(new RegExp(`<script[^>]*nonce="${nonce.replace(/[+/=]/g, '\\$&')}"[^>]*type="module"[^>]*src="/_nuxt/`))
  for (const tag of reply.body.matchAll(/<link\b[^>]*rel="stylesheet"[^>]*>/g)) expect(tag[0]).toContain(`nonce="${nonce}"`)

  expect(policy.get('style-src')).toEqual(["'self'", `'nonce-${nonce}'`])
  expect(policy.get('frame-ancestors')).toEqual(["'none'"])
  expect(policy.get('object-src')).toEqual(["'none'"])
  expect(policy.get('base-uri')).toEqual(["'none'"])
  expect(policy.get('form-action')).toEqual(["'self'"])
  expect(policy.get('img-src')).toEqual(["'self'", 'data:'])
  // The test server's public URL is http.
  expect(policy.has('upgrade-insecure-requests')).toBe(false)

  expectEveryResponseHeaders(reply.headers)
  expect(reply.headers.get('permissions-policy')).toMatch(/camera=\(\)/)
  expect(reply.headers.get('permissions-policy')).toMatch(/microphone=\(\)/)
  expect(reply.headers.get('permissions-policy')).toMatch(/geolocation=\(\)/)
  expect(reply.headers.get('cross-origin-opener-policy')).toBe('same-origin')
  expect(reply.headers.get('cache-control')).toBe('no-store')
  expect(reply.headers.get('strict-transport-security')).toBeNull()
  return nonce
}

describe('a server-rendered page', () => {
  it('the sign-in page: a CSP whose nonce is on every script tag, no framing, nosniff, no referrer, no-store, no x-powered-by', async () => {
    const reply = await new Client(app.url).get('/sign-in')
    expect(reply.status).toBe(200)
    expectPagePolicy(reply)
  })

  it('a signed-in page (Today) the same, with a new nonce on each request', async () => {
    const first = await elias.get('/today')
    expect(first.status).toBe(200)
    expect(first.body).toContain('Elias')
    const second = await elias.get('/today')
    expect(expectPagePolicy(first)).not.toBe(expectPagePolicy(second))
  })

  it('a page that redirects a signed-out visitor to sign-in keeps the policy, without a nonce placeholder', async () => {
    const reply = await new Client(app.url).get('/today')
    expect(reply.status).toBe(302)
    expect(reply.headers.get('content-security-policy')).not.toContain('{{nonce}}')
    const policy = csp(reply.headers)
    expect(policy.get('script-src')).toEqual(["'self'", "'strict-dynamic'"])
    expect(policy.get('frame-ancestors')).toEqual(["'none'"])
    expect(reply.headers.get('cache-control')).toBe('no-store')
    expectEveryResponseHeaders(reply.headers)
  })
})

describe('JSON', () => {
  it("a patient's schedule is no-store and nosniff, without x-powered-by", async () => {
    const reply = await elias.get(`/api/patients/${eliasId}/schedule`)
    expect(reply.status).toBe(200)
    expect(reply.headers.get('content-type')).toMatch(/application\/json/)
    expect(reply.headers.get('cache-control')).toBe('no-store')
    expectEveryResponseHeaders(reply.headers)
  })

  it('an error answer is no-store and nosniff too', async () => {
    const reply = await new Client(app.url).get(`/api/patients/${eliasId}/schedule`)
    expect(reply.status).toBe(401)
    expect(reply.headers.get('cache-control')).toBe('no-store')
    expectEveryResponseHeaders(reply.headers)
  })
})

describe('a file', () => {
  it('the calendar download is no-store and still an attachment', async () => {
    const reply = await elias.get(`/api/appointments/${eliasAppointmentId}/calendar.ics`)
    expect(reply.status).toBe(200)
    expect(reply.headers.get('content-type')).toMatch(/text\/calendar/)
    expect(reply.headers.get('content-disposition')).toBe('attachment; filename="tidewell-appointment.ics"')
    expect(reply.headers.get('cache-control')).toMatch(/\bno-store\b/)
    expectEveryResponseHeaders(reply.headers)
  })
})

describe('a static asset', () => {
  it('a build file under /_nuxt/ is still cached for a year, with nosniff and no x-powered-by', async () => {
    const page = await new Client(app.url).get('/sign-in')
    const src = /<script[^>]*\bsrc="(\/_nuxt\/[^"]+\.js)"/.exec(page.body)?.[1]
    expect(src, 'the sign-in page names its entry script').toBeTruthy()
    const reply = await new Client(app.url).get(src!)
    expect(reply.status).toBe(200)
    expect(reply.headers.get('cache-control')).toMatch(/max-age=31536000/)
    expect(reply.headers.get('cache-control')).toMatch(/immutable/)
    expectEveryResponseHeaders(reply.headers)
  })
})

describe('HSTS follows the public URL', () => {
  it('is absent when the public URL is http (above) and sent on every kind of response when it is https', async () => {
    const plain = await new Client(app.url).get('/api/clinic')
    expect(plain.headers.get('strict-transport-security')).toBeNull()

    // Still plain http underneath (a TLS proxy would stand in front); only the header is checked.
    const secure = await startApp({ env: { NUXT_PUBLIC_URL: 'https://tidewell.example.org' } })
    try {
      const visitor = new Client(secure.url)
      const page = await visitor.get('/sign-in')
      const json = await visitor.get('/api/clinic')
      const src = /<script[^>]*\bsrc="(\/_nuxt\/[^"]+\.js)"/.exec(page.body)![1]!
      const asset = await visitor.get(src)
      const refused = await visitor.get('/api/patients')
      for (const reply of [page, json, asset, refused]) {
        expect(reply.headers.get('strict-transport-security')).toBe('max-age=31536000; includeSubDomains')
      }
      expect(refused.status).toBe(401)
      expect(csp(page.headers).has('upgrade-insecure-requests')).toBe(true)
    }
    finally {
      await secure.stop()
    }
  })
})
