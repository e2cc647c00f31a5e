import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { diaryEntry } from '../support/diary'
import { sql } from '../support/sqlite'

/*
 * Issue 9: the risk profile (nurses and clinicians) that raises triage, and the phones the
 * nurse calls: his own (he and staff set them, caregivers read them) and a caregiver's own.
 */

let app: RunningApp
let ids: Record<string, number>

beforeAll(async () => {
  app = await startApp()
  const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
  const roster = (await nurse.get('/api/patients')).body as { id: number, clinicNumber: string }[]
  ids = Object.fromEntries(roster.map(p => [p.clinicNumber, p.id]))
})
afterAll(() => app?.stop())

const NO_RISKS = { spinalMetastases: false, urinaryObstruction: false, diabetes: false, heartDisease: false, longQt: false, seizures: false, chemotherapy: false }

// A temperature of 38.5 °C: a fever (NICE NG51 / CG151 use 38 °C and above, from memory).
const fever = () => diaryEntry({ infection: { any: true, temperature: { unit: '°C', value: 38.5 }, shakingChills: false, feelsUnwell: false } })

describe('GET|PUT /api/patients/:id/risk-profile', () => {
  it('a nurse or a clinician reads and sets it; it is audited', async () => {
    const id = ids['LPU-1009']!
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    expect((await nurse.get(`/api/patients/${id}/risk-profile`)).body).toEqual({ riskProfile: NO_RISKS })
    const set = await nurse.put(`/api/patients/${id}/risk-profile`, { ...NO_RISKS, spinalMetastases: true })
    expect(set.status, JSON.stringify(set.body)).toBe(200)
    expect(set.body.riskProfile).toEqual({ ...NO_RISKS, spinalMetastases: true })
    const clinician = await Client.signIn(app.url, 'clinician@demo.tidewell.test')
    expect((await clinician.get(`/api/patients/${id}/risk-profile`)).body.riskProfile.spinalMetastases).toBe(true)
    expect((await clinician.put(`/api/patients/${id}/risk-profile`, { ...NO_RISKS, seizures: true })).status).toBe(200)
    expect((await nurse.get(`/api/patients/${id}/risk-profile`)).body.riskProfile).toEqual({ ...NO_RISKS, seizures: true })
    const audit = await sql<{ action: string, outcome: string }>(app, `SELECT action, outcome FROM audit_events WHERE patient_id = ? AND action = 'risk-profile.manage'`, [id])
    expect(audit.length).toBe(5) // three reads, two changes
    expect(audit.every(a => a.outcome === 'done')).toBe(true)
  })

  it('the patient cannot read or set his own, a caregiver neither, another patient\'s id answers 404', async () => {
    const id = ids['LPU-1001']!
    const patient = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    expect((await patient.put(`/api/patients/${id}/risk-profile`, NO_RISKS)).status).toBe(403)
    expect((await patient.get(`/api/patients/${id}/risk-profile`)).status).toBe(403)
    expect((await patient.get(`/api/patients/${ids['LPU-1002']}/risk-profile`)).status).toBe(404)
    const caregiver = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    expect((await caregiver.put(`/api/patients/${id}/risk-profile`, NO_RISKS)).status).toBe(403)
    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    expect((await admin.put(`/api/patients/${id}/risk-profile`, NO_RISKS)).status).toBe(403)
  })

  it('refuses a profile with a factor missing, unknown or not a yes or no', async () => {
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const id = ids['LPU-1009']!
    for (const body of [{ ...NO_RISKS, chemotherapy: undefined }, { ...NO_RISKS, smoker: true }, { ...NO_RISKS, diabetes: 'yes' }]) {
      const reply = await nurse.put(`/api/patients/${id}/risk-profile`, body)
      expect(reply.status, JSON.stringify(body)).toBe(400)
      expect(reply.body.message).toBe('errors.invalidInput')
    }
  })

  it('raises triage: a fever during chemotherapy is an emergency', async () => {
    const id = ids['LPU-1006']!
    const patient = await Client.signIn(app.url, 'kenji@demo.tidewell.test')
    const before = await patient.post(`/api/patients/${id}/diary`, fever())
    expect(before.status).toBe(201)
    expect(before.body.level).not.toBe('emergency')
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    expect((await nurse.put(`/api/patients/${id}/risk-profile`, { ...NO_RISKS, chemotherapy: true })).status).toBe(200)
    // NICE CG151 (neutropenic sepsis): a fever during anticancer treatment is a medical emergency.
    const after = await patient.post(`/api/patients/${id}/diary`, fever())
    expect(after.body.level).toBe('emergency')
    expect(after.body.reasons.map((r: { rule: string }) => r.rule)).toContain('fever-during-chemotherapy')
    // The entry stored before keeps the triage it got.
    expect((await patient.get(`/api/patients/${id}/diary/${before.body.id}`)).body.level).toBe(before.body.level)
    const [item] = await sql<{ id: number }>(app, 'SELECT id FROM triage_items WHERE diary_entry_id = ?', [after.body.id])
    const detail = (await nurse.get(`/api/triage/${item!.id}`)).body
    expect(detail.riskProfile).toEqual({ ...NO_RISKS, chemotherapy: true })
  })
})

describe('GET|PUT /api/patients/:id/contact', () => {
  const contact = { phones: [{ label: 'mobile', number: '(312) 555-0177' }, { label: 'home', number: '+1 312 555 0178' }], bestTimes: 'After lunch', preferred: 'phone' }

  it('the patient sets his own, a caregiver reads it and cannot change it, staff set it', async () => {
    const id = ids['LPU-1001']!
    const patient = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const set = await patient.put(`/api/patients/${id}/contact`, contact)
    expect(set.status, JSON.stringify(set.body)).toBe(200)
    expect(set.body).toEqual(contact)
    const caregiver = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    expect((await caregiver.get(`/api/patients/${id}/contact`)).body).toEqual(contact)
    expect((await caregiver.put(`/api/patients/${id}/contact`, { ...contact, phones: [] })).status).toBe(403)
    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    const changed = await admin.put(`/api/patients/${id}/contact`, { ...contact, preferred: 'caregiver' })
    expect(changed.status).toBe(200)
    expect((await patient.get(`/api/patients/${id}/contact`)).body.preferred).toBe('caregiver')
    expect((await patient.put(`/api/patients/${ids['LPU-1002']}/contact`, contact)).status).toBe(404)
    expect((await patient.get(`/api/patients/${ids['LPU-1002']}/contact`)).status).toBe(404)
  })

  it('refuses a number that is not one, more than three, a bad label or preference, or control characters', async () => {
    const id = ids['LPU-1011']!
    const patient = await Client.signIn(app.url, 'howard@demo.tidewell.test')
    const bad = [
      [{ ...contact, phones: [{ label: 'mobile', number: 'call me' }] }, 'phones.0.number'],
      [{ ...contact, phones: [{ label: 'mobile', number: '555-01' }] }, 'phones.0.number'],
      [{ ...contact, phones: [{ label: 'mobile', number: '1234567890123456' }] }, 'phones.0.number'],
      [{ ...contact, phones: [{ label: 'pager', number: '(312) 555-0177' }] }, 'phones.0.label'],
      [{ ...contact, phones: Array.from({ length: 4 }, () => contact.phones[0]) }, 'phones'],
      [{ ...contact, preferred: 'fax' }, 'preferred'],
      [{ ...contact, bestTimes: 'x'.repeat(201) }, 'bestTimes'],
      [{ ...contact, extra: 1 }, '_'],
    ] as const
    for (const [body, field] of bad) {
      const reply = await patient.put(`/api/patients/${id}/contact`, body)
      expect(reply.status, field).toBe(400)
      expect(Object.keys(reply.body.data.fieldErrors), field).toContain(field)
    }
    const hidden = await patient.put(`/api/patients/${id}/contact`, { phones: [{ label: 'home', number: '(207) 555\u0000-0114' }], bestTimes: '\u202EMornings', preferred: 'email' })
    expect(hidden.status).toBe(400)
    expect(hidden.body.data.fieldErrors['phones.0.number']).toContain('validation.text.unsafe')
    expect(hidden.body.data.fieldErrors.bestTimes).toEqual(['validation.text.unsafe'])
    const trimmed = await patient.put(`/api/patients/${id}/contact`, { phones: [{ label: 'home', number: ' (207) 555-0114 ' }], bestTimes: ' Mornings ', preferred: 'email' })
    expect(trimmed.status).toBe(200)
    expect(trimmed.body).toEqual({ phones: [{ label: 'home', number: '(207) 555-0114' }], bestTimes: 'Mornings', preferred: 'email' })
  })
})

describe('PUT /api/me/phone and the triage item', () => {
  it('a caregiver keeps her own phone; the nurse sees his phones, best times and his caregivers\' phones on the item', async () => {
    const caregiver = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    expect((await caregiver.put('/api/me/phone', { phone: 'not a phone' })).status).toBe(400)
    const set = await caregiver.put('/api/me/phone', { phone: '(312) 555-0190' })
    expect(set.status).toBe(200)
    expect((await caregiver.get('/api/me/phone')).body).toEqual({ phone: '(312) 555-0190' })
    const patient = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    expect((await patient.put('/api/me/phone', { phone: '(312) 555-0190' })).status).toBe(403)

    const id = ids['LPU-1001']!
    // Blood in the urine is urgent (issue 4 defaults, common practice)
    const entry = await patient.post(`/api/patients/${id}/diary`, diaryEntry({ urinary: { blood: true } }))
    const [item] = await sql<{ id: number }>(app, 'SELECT id FROM triage_items WHERE diary_entry_id = ?', [entry.body.id])
    const nurse = await Client.signIn(app.url, 'nurse2@demo.tidewell.test')
    const detail = (await nurse.get(`/api/triage/${item!.id}`)).body
    expect(detail.contact.phones.length).toBeGreaterThan(0)
    expect(detail.contact).toEqual((await patient.get(`/api/patients/${id}/contact`)).body)
    expect(detail.caregivers).toEqual([{ name: 'Marisol Marwood', phone: '(312) 555-0190' }])
    expect(detail.noteRead).toBe(false)
    expect(detail.riskProfile).toEqual(NO_RISKS)
    expect((await caregiver.put('/api/me/phone', { phone: null })).body).toEqual({ phone: null })
    expect((await nurse.get(`/api/triage/${item!.id}`)).body.caregivers).toEqual([{ name: 'Marisol Marwood', phone: null }])
  })
})
