import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { sql } from '../support/sqlite'

let app: RunningApp
beforeAll(async () => {
  app = await startApp()
})
afterAll(() => app?.stop())

describe('clinic settings', () => {
  it('an admin changes the emergency number; every page then shows it; the change is audited', async () => {
    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    const current = (await admin.get('/api/admin/settings')).body
    expect(current.emergencyNumber).toBe('911')
    expect(current.nursesOnDuty).toEqual(['nurse@demo.tidewell.test', 'nurse2@demo.tidewell.test'])
    const saved = await admin.request('PUT', '/api/admin/settings', { ...current, emergencyNumber: '112', windowLateDays: 5 })
    expect(saved.status).toBe(200)
    expect(saved.body).toMatchObject({ emergencyNumber: '112', windowLateDays: 5 })
    expect((await new Client(app.url).get('/api/clinic')).body.emergencyNumber).toBe('112')
    const audit = await sql<{ resource: string }>(app, `SELECT resource FROM audit_events WHERE action = 'settings.update'`)
    expect(audit.map(a => a.resource)).toEqual(['settings:emergencyNumber,windowLateDays'])
  })

  it('refuses bad values at the field and keeps the old ones', async () => {
    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    const current = (await admin.get('/api/admin/settings')).body
    const reply = await admin.request('PUT', '/api/admin/settings', { ...current, timeZone: 'Mars/Olympus', nursesOnDuty: ['not-an-email'], windowEarlyDays: -1 })
    expect(reply.status).toBe(400)
    expect(Object.keys(reply.body.data.fieldErrors).sort()).toEqual(['nursesOnDuty.0', 'timeZone', 'windowEarlyDays'])
    expect((await admin.get('/api/admin/settings')).body).toEqual(current)
  })

  it('only admins read or change them', async () => {
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    expect((await nurse.get('/api/admin/settings')).status).toBe(403)
    expect((await nurse.request('PUT', '/api/admin/settings', {})).status).toBe(403)
  })
})
