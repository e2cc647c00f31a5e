import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { sql } from '../support/sqlite'

/*
 * The request guard (server/middleware/01.request-guard.ts) against the built server: the
 * cross-site requests of issue 11's review, JSON only, and the body limit. OWASP ASVS 4.0.3,
 * stated from memory (the numbers and wording not checked against the standard's text):
 * V4.2.2 (a strong anti-CSRF mechanism protects authenticated functionality), V13.2.3
 * (RESTful services that use cookies are protected from CSRF, e.g. by Origin header checks)
 * and V13.2.5 (REST services check that the incoming Content-Type is the expected one). The
 * body limit is issue 11's own requirement (64 kB for JSON); which ASVS item it falls under
 * is not claimed here.
 */

const EVIL = 'https://evil.example'

let app: RunningApp
let admin: Client
let nurse: Client
let elias: Client
let eliasId: number
let ids: Record<string, number>
/** The clinic's calendar date, as the server counts it. */
let today: string

beforeAll(async () => {
  app = await startApp()
  admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
  nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
  elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
  eliasId = (await elias.get('/api/_auth/session')).body.user.patientId
  ids = Object.fromEntries(((await nurse.get('/api/patients')).body as { id: number, clinicNumber: string }[]).map(p => [p.clinicNumber, p.id]))
  today = (await nurse.get(`/api/patients/${ids['LPU-1008']}/labs`)).body.today
})
afterAll(() => app?.stop())

const count = async (table: string) => (await sql<{ n: number }>(app, `SELECT COUNT(*) AS n FROM ${table}`))[0]!.n

/** What a form on another site makes the browser send: a form-encoded body, the other site's Origin and the user's cookie. */
async function crossSiteForm(as: Client, path: string, fields: Record<string, string>) {
  const response = await fetch(new URL(path, app.url), {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded', 'origin': EVIL, 'cookie': as.cookieHeader() },
    body: new URLSearchParams(fields).toString(),
    redirect: 'manual',
  })
  return { status: response.status, body: await response.json().catch(() => null) }
}

describe('cross-site requests with the user\'s cookie are refused and change nothing', () => {
  it('an admin\'s session does not create a clinician account from a form on another site', async () => {
    const users = await count('users')
    const reply = await crossSiteForm(admin, '/api/users', { email: 'planted@evil.example', name: 'Planted', role: 'clinician' })
    expect(reply.status).toBe(403)
    expect(reply.body).toMatchObject({ statusCode: 403, message: 'errors.crossSite' })
    expect(await count('users')).toBe(users)
    expect(await sql(app, 'SELECT id FROM users WHERE email = ?', ['planted@evil.example'])).toHaveLength(0)
  })

  it('a nurse\'s session does not record a lab result or act on a triage item', async () => {
    const labs = await count('lab_results')
    const lab = await crossSiteForm(nurse, `/api/patients/${ids['LPU-1002']}/labs`, { kind: 'psa', takenOn: '2026-01-05', value: '40' })
    expect(lab.status).toBe(403)
    expect(await count('lab_results')).toBe(labs)

    // A testosterone above castrate level on therapy opens a queue item (same origin, JSON: accepted).
    const escaped = await nurse.post(`/api/patients/${ids['LPU-1002']}/labs`, { kind: 'testosterone', takenOn: today, unit: 'ng/dL', value: 80 })
    expect(escaped.status, JSON.stringify(escaped.body)).toBe(201)
    const [item] = await sql<{ id: number }>(app, 'SELECT id FROM triage_items WHERE source_key = ?', [`lab:${escaped.body.id}`])
    expect(item).toBeTruthy()
    const events = await count('triage_events')
    const acted = await crossSiteForm(nurse, `/api/triage/${item!.id}/events`, { type: 'close' })
    expect(acted.status).toBe(403)
    expect(await count('triage_events')).toBe(events)
    expect((await sql<{ status: string }>(app, 'SELECT status FROM triage_items WHERE id = ?', [item!.id]))[0]!.status).not.toBe('closed')
  })

  it('a patient\'s session does not confirm his appointment (a route with no body)', async () => {
    const before = (await elias.get(`/api/patients/${eliasId}/schedule`)).body.nextAppointment
    expect(before).toMatchObject({ status: 'booked', confirmedAt: null })
    const reply = await crossSiteForm(elias, `/api/appointments/${before.id}/confirm`, {})
    expect(reply.status).toBe(403)
    expect((await elias.get(`/api/patients/${eliasId}/schedule`)).body.nextAppointment).toMatchObject({ id: before.id, status: 'booked', confirmedAt: null })
  })

  it('a forged Origin with a JSON body is refused too', async () => {
    const users = await count('users')
    const reply = await admin.request('POST', '/api/users', { email: 'forged@evil.example', name: 'Forged', role: 'clinician' }, { origin: EVIL })
    expect(reply.status).toBe(403)
    expect(reply.body.message).toBe('errors.crossSite')
    expect(await count('users')).toBe(users)
  })

  it('an Origin of "null" (a sandboxed frame, a data: page) and a look-alike host are refused', async () => {
    for (const origin of ['null', `${app.url}.evil.example`, app.url.replace('http:', 'https:')]) {
      const reply = await elias.request('PUT', '/api/me/phone', { phone: '(312) 555-0100' }, { origin })
      expect(reply.status, origin).toBe(403)
    }
  })
})

describe('without an Origin, Sec-Fetch-Site decides', () => {
  const withoutOrigin = (as: Client, site?: string) => fetch(new URL(`/api/patients/${ids['LPU-1008']}/labs`, app.url), {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'cookie': as.cookieHeader(), ...(site ? { 'sec-fetch-site': site } : {}) },
    body: JSON.stringify({ kind: 'hba1c', takenOn: today, value: 5.6 }),
  })

  it('Sec-Fetch-Site: same-origin is accepted', async () => {
    const labs = await count('lab_results')
    const reply = await withoutOrigin(nurse, 'same-origin')
    expect(reply.status, JSON.stringify(await reply.json())).toBe(201)
    expect(await count('lab_results')).toBe(labs + 1)
  })

  it('Sec-Fetch-Site: cross-site, same-site or none at all is refused', async () => {
    const labs = await count('lab_results')
    for (const site of ['cross-site', 'same-site', 'none', undefined]) {
      const reply = await withoutOrigin(nurse, site)
      expect(reply.status, String(site)).toBe(403)
      expect((await reply.json()).message).toBe('errors.crossSite')
    }
    expect(await count('lab_results')).toBe(labs)
  })
})

describe('bodies: JSON only, and at most 64 kB', () => {
  it('a text/plain body with the right Origin answers 415', async () => {
    const response = await fetch(new URL('/api/me/phone', app.url), {
      method: 'PUT',
      headers: { 'content-type': 'text/plain', 'origin': new URL(app.url).origin, 'cookie': elias.cookieHeader() },
      body: JSON.stringify({ phone: '(312) 555-0100' }),
    })
    expect(response.status).toBe(415)
    expect(await response.json()).toMatchObject({ statusCode: 415, message: 'errors.jsonOnly' })
  })

  it('a form body with the right Origin answers 415', async () => {
    const users = await count('users')
    const response = await fetch(new URL('/api/users', app.url), {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded', 'origin': new URL(app.url).origin, 'cookie': admin.cookieHeader() },
      body: new URLSearchParams({ email: 'form@demo.tidewell.test', name: 'Form', role: 'clinician' }).toString(),
    })
    expect(response.status).toBe(415)
    expect(await count('users')).toBe(users)
  })

  it('application/json; charset=utf-8 is JSON', async () => {
    const response = await fetch(new URL('/api/auth/sign-in', app.url), {
      method: 'POST',
      headers: { 'content-type': 'application/json; charset=utf-8', 'origin': new URL(app.url).origin },
      body: JSON.stringify({ email: 'nobody@demo.tidewell.test', password: 'not the password at all' }),
    })
    expect(response.status).toBe(401)
  })

  it('a 10 MB body to sign-in answers 413 before it is read, and nobody is signed in', async () => {
    const response = await fetch(new URL('/api/auth/sign-in', app.url), {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'origin': new URL(app.url).origin },
      body: JSON.stringify({ email: 'patient@demo.tidewell.test', password: 'tidewell-demo', padding: 'x'.repeat(10 * 1024 * 1024) }),
    })
    expect(response.status).toBe(413)
    expect(await response.json()).toMatchObject({ statusCode: 413, message: 'errors.bodyTooLarge' })
    expect(response.headers.getSetCookie()).toEqual([])
  })

  it('64 kB is the line: one byte over answers 413, at the limit the route reads it', async () => {
    const bodyOf = (size: number) => {
      const base = JSON.stringify({ email: 'nobody@demo.tidewell.test', password: '' })
      return JSON.stringify({ email: 'nobody@demo.tidewell.test', password: 'p'.repeat(size - base.length) })
    }
    const send = (body: string) => fetch(new URL('/api/auth/sign-in', app.url), {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'origin': new URL(app.url).origin },
      body,
    })
    expect(bodyOf(65_536)).toHaveLength(65_536)
    expect((await send(bodyOf(65_537))).status).toBe(413)
    // Read and refused by the route itself (a password that long is invalid input or a failed sign-in), not by the guard.
    expect([400, 401]).toContain((await send(bodyOf(65_536))).status)
  })

  it('a body without a length (chunked) answers 411', async () => {
    const body = new ReadableStream({
      start(controller) {
        controller.enqueue(new TextEncoder().encode(JSON.stringify({ email: 'patient@demo.tidewell.test', password: 'tidewell-demo' })))
        controller.close()
      },
    })
    const response = await fetch(new URL('/api/auth/sign-in', app.url), {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'origin': new URL(app.url).origin },
      body,
      duplex: 'half',
    } as RequestInit)
    expect(response.status).toBe(411)
    expect(await response.json()).toMatchObject({ statusCode: 411, message: 'errors.lengthRequired' })
    expect(response.headers.getSetCookie()).toEqual([])
  })
})

describe('same-origin requests still work', () => {
  it('a JSON request from the app\'s own origin changes what it should', async () => {
    const reply = await nurse.post(`/api/patients/${ids['LPU-1008']}/labs`, { kind: 'psa', takenOn: today, value: '0.3' })
    expect(reply.status, JSON.stringify(reply.body)).toBe(201)
  })

  it('a request with no body (confirm) from the app\'s own origin goes through, and GET needs no Origin', async () => {
    const appointment = (await elias.get(`/api/patients/${eliasId}/schedule`)).body.nextAppointment
    const response = await fetch(new URL(`/api/appointments/${appointment.id}/confirm`, app.url), {
      method: 'POST',
      headers: { origin: new URL(app.url).origin, cookie: elias.cookieHeader() },
    })
    expect(response.status).toBe(200)
    expect(await response.json()).toMatchObject({ status: 'confirmed' })
  })

  it('sign-out through nuxt-auth-utils\' DELETE /api/_auth/session (what useUserSession().clear() sends) still ends the session', async () => {
    const patient = await Client.signIn(app.url, 'bernard@demo.tidewell.test')
    const refused = await patient.request('DELETE', '/api/_auth/session', undefined, { origin: EVIL })
    expect(refused.status).toBe(403)
    expect((await patient.get('/api/_auth/session')).body.user).toBeTruthy()
    expect((await patient.post('/api/auth/sign-out')).status).toBeLessThan(300)
    expect((await patient.delete('/api/_auth/session')).status).toBe(200)
    expect((await patient.get('/api/_auth/session')).body.user).toBeUndefined()
  })
})
