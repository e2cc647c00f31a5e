import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { diaryEntry } from '../support/diary'
import { MailCatcher } from '../support/mail-catcher'

let app: RunningApp
let mail: MailCatcher
let ids: Record<string, number>

beforeAll(async () => {
  mail = await MailCatcher.start()
  app = await startApp({ smtpUrl: mail.url })
  const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
  const roster = (await nurse.get('/api/patients')).body as { id: number, clinicNumber: string }[]
  ids = Object.fromEntries(roster.map(p => [p.clinicNumber, p.id]))
})
afterAll(async () => {
  await app?.stop()
  await mail?.stop()
})

describe('POST /api/patients/:id/diary', () => {
  it('stores a quiet week as level none and lists it, newest first', async () => {
    const patient = await Client.signIn(app.url, 'howard@demo.tidewell.test')
    const id = ids['LPU-1011']!
    // No earlier entries, so no baseline: CTCAE v5.0 hot flashes grade 2 (moderate,
    // limits instrumental ADL) -> routine (issue 4 defaults)
    const first = await patient.post(`/api/patients/${id}/diary`, diaryEntry({ hotFlushes: { perDay: 4, worstSeverity: 'moderate', interference: 'usual-activities' } }))
    expect(first.status).toBe(201)
    expect(first.body.level).toBe('routine')
    expect(first.body.hotFlushScore).toBe(4 * 2) // Sloan 2001: count x severity weight (moderate = 2, weights from memory)
    expect(first.body.enteredBy).toEqual({ name: 'Howard Tillinghast', relation: 'self' })
    const second = await patient.post(`/api/patients/${id}/diary`, diaryEntry())
    expect(second.status).toBe(201)
    expect(second.body).toMatchObject({ level: 'none', reasons: [], respondBy: null })
    const list = await patient.get(`/api/patients/${id}/diary`)
    expect(list.body.total).toBe(2)
    expect(list.body.entries.map((e: { id: number }) => e.id)).toEqual([second.body.id, first.body.id])
  })

  it('refuses bad input with 400 and a message per field, and stores nothing', async () => {
    const patient = await Client.signIn(app.url, 'augustin@demo.tidewell.test')
    const id = ids['LPU-1010']!
    const bad = [
      [diaryEntry({ pain: { worst: 11 } }), 'pain.worst'],
      [{ ...diaryEntry(), sneaky: true }, '_'],
      [diaryEntry({ note: 'x'.repeat(3000) }), 'note'],
      [diaryEntry({ mood: { phq2Interest: 4, phq2Down: 0 } }), 'mood.phq2Interest'],
      [diaryEntry({ sugar: { glucose: { value: 900, unit: 'mg/dL' } } }), 'sugar.glucose.value'],
    ] as const
    for (const [body, field] of bad) {
      const reply = await patient.post(`/api/patients/${id}/diary`, body)
      expect(reply.status, field).toBe(400)
      expect(reply.body.message).toBe('errors.invalidInput')
      expect(Object.keys(reply.body.data.fieldErrors), field).toContain(field)
    }
    expect((await patient.get(`/api/patients/${id}/diary`)).body.total).toBe(0)
  })

  it('answers 404 for another patient\'s diary, to read or to write', async () => {
    const patient = await Client.signIn(app.url, 'augustin@demo.tidewell.test')
    expect((await patient.get(`/api/patients/${ids['LPU-1011']}/diary`)).status).toBe(404)
    expect((await patient.post(`/api/patients/${ids['LPU-1011']}/diary`, diaryEntry())).status).toBe(404)
  })

  it('lets a caregiver log only with the grant, and records who entered it', async () => {
    const viewOnly = await Client.signIn(app.url, 'dana@demo.tidewell.test')
    expect((await viewOnly.post(`/api/patients/${ids['LPU-1002']}/diary`, diaryEntry())).status).toBe(403)
    const helper = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    const reply = await helper.post(`/api/patients/${ids['LPU-1001']}/diary`, diaryEntry())
    expect(reply.status).toBe(201)
    expect(reply.body.enteredBy).toEqual({ name: 'Marisol Marwood', relation: 'caregiver' })
  })

  it('an emergency entry opens a queue item and alerts the nurses on duty without a name or clinical words', async () => {
    const patient = await Client.signIn(app.url, 'odell@demo.tidewell.test')
    const reply = await patient.post(`/api/patients/${ids['LPU-1004']}/diary`, diaryEntry({ rightNow: { newWeakness: true } }))
    expect(reply.status).toBe(201)
    // NICE NG234: new limb weakness -> immediate (emergency)
    expect(reply.body.level).toBe('emergency')
    expect(reply.body.reasons[0].level).toBe('emergency')
    const alerts = await Promise.all(['nurse@demo.tidewell.test', 'nurse2@demo.tidewell.test'].map(to => mail.waitFor(m => m.to.includes(to) && /TW-\d{6}/.test(m.subject))))
    for (const alert of alerts) {
      const words = `${alert.subject}\n${alert.text}`
      expect(words).toMatch(/emergency/i)
      expect(words).toMatch(/\/staff\/triage\/\d+/)
      expect(words).not.toMatch(/Odell|Pruitt|LPU-1004|weakness|leg|spinal|pain/i)
    }
  })
})

describe('weekly diary reminder', () => {
  it('e-mails a patient a week after his last entry, once for that week, in his language', async () => {
    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    const inTenDays = new Date(Date.now() + 10 * 86_400_000).toISOString()
    const first = await admin.post('/api/admin/tasks/diary:remind', { now: inTenDays })
    expect(first.status).toBe(200)
    expect(first.body.result.reminded).toBeGreaterThan(0)
    const again = await admin.post('/api/admin/tasks/diary:remind', { now: inTenDays })
    expect(again.body.result.reminded).toBe(0)
    const spanish = await mail.waitFor(m => m.to.includes('luis@demo.tidewell.test'))
    expect(spanish.subject).toBe('Es hora de su diario semanal de Tidewell')
    await new Promise(r => setTimeout(r, 800))
    expect(mail.messages.filter(m => m.to.includes('luis@demo.tidewell.test'))).toHaveLength(1)
  })
})
