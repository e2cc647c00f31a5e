import { readdirSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'

const apiDir = new URL('../../server/api/', import.meta.url).pathname
// Routes that must answer without a session (and reveal nothing about patients).
const PUBLIC = new Set([
  'POST /api/auth/sign-in',
  'POST /api/auth/sign-out',
  'POST /api/auth/forgot-password',
  'POST /api/auth/set-password',
  'GET /api/health',
  'GET /api/ready',
  'GET /api/clinic',
  `GET /api/circle-invitations/${'x'.repeat(43)}`,
  `POST /api/circle-invitations/${'x'.repeat(43)}/accept`,
])

/** Every server route, read from the file names (method in the name), with ids filled in. */
function routes(dir = apiDir): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = join(dir, name)
    if (statSync(full).isDirectory()) return routes(full)
    const match = relative(apiDir, full).match(/^(.*?)\.(get|post|patch|put|delete)\.ts$/)
    if (!match) return []
    const path = `/api/${match[1]}`.replace(/\/index$/, '').replace(/\[[^\]]+\]/g, param => (param === '[token]' ? 'x'.repeat(43) : param === '[name]' ? 'outbox:send' : '1'))
    return [`${match[2]!.toUpperCase()} ${path}`]
  })
}

let app: RunningApp
beforeAll(async () => {
  app = await startApp()
})
afterAll(() => app?.stop())

describe('signed out', () => {
  const all = routes()
  it('finds the routes on disk', () => {
    expect(all.length).toBeGreaterThan(10)
  })
  for (const route of all.filter(r => !PUBLIC.has(r))) {
    it(`${route} answers 401`, async () => {
      const [method, path] = route.split(' ') as [string, string]
      const reply = await new Client(app.url).request(method, path, method === 'GET' || method === 'DELETE' ? undefined : {})
      expect(reply.status).toBe(401)
    })
  }
})

describe('role guards', () => {
  it('a patient cannot open the roster or the account list', async () => {
    const patient = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    expect((await patient.get('/api/patients')).status).toBe(403)
    expect((await patient.get('/api/users')).status).toBe(403)
    expect((await patient.post('/api/users', { email: 'x@demo.tidewell.test', name: 'X', role: 'admin' })).status).toBe(403)
  })

  it('a patient reads his own record, and another patient\'s answers 404', async () => {
    const patient = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const own = (await patient.get('/api/_auth/session')).body.user.patientId as number
    expect((await patient.get(`/api/patients/${own}`)).status).toBe(200)
    expect((await patient.get(`/api/patients/${own + 1}`)).status).toBe(404)
    expect((await patient.get('/api/patients/999999')).status).toBe(404)
    expect((await patient.get('/api/patients/not-a-number')).status).toBe(404)
  })

  it('a caregiver sees only the patient who granted access', async () => {
    const staff = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const roster = (await staff.get('/api/patients')).body as { id: number, clinicNumber: string }[]
    const bernard = roster.find(p => p.clinicNumber === 'LPU-1002')!.id
    const elias = roster.find(p => p.clinicNumber === 'LPU-1001')!.id
    const dana = await Client.signIn(app.url, 'dana@demo.tidewell.test')
    expect((await dana.get(`/api/patients/${bernard}`)).status).toBe(200)
    expect((await dana.get(`/api/patients/${elias}`)).status).toBe(404)
  })

  it('nurses, clinicians and admins read the roster; only admins read accounts and the mail catcher', async () => {
    for (const email of ['nurse@demo.tidewell.test', 'clinician@demo.tidewell.test', 'admin@demo.tidewell.test']) {
      const staff = await Client.signIn(app.url, email)
      const roster = await staff.get('/api/patients')
      expect(roster.status).toBe(200)
      expect(roster.body).toHaveLength(12)
      const isAdmin = email.startsWith('admin')
      expect((await staff.get('/api/users')).status).toBe(isAdmin ? 200 : 403)
      expect((await staff.get('/api/admin/mail')).status).toBe(isAdmin ? 200 : 403)
    }
  })

  it('no password hash ever leaves the server', async () => {
    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    const users = await admin.get('/api/users')
    expect(JSON.stringify(users.body)).not.toMatch(/passwordHash|password_hash|\$scrypt/)
  })
})
