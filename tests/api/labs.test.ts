import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { MailCatcher } from '../support/mail-catcher'
import { refuseInserts, sql } from '../support/sqlite'

let app: RunningApp
let mail: MailCatcher
let nurse: Client
let ids: Record<string, number>
let today: string

beforeAll(async () => {
  mail = await MailCatcher.start()
  app = await startApp({ smtpUrl: mail.url })
  nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
  const roster = (await nurse.get('/api/patients')).body as { id: number, clinicNumber: string }[]
  ids = Object.fromEntries(roster.map(p => [p.clinicNumber, p.id]))
  today = (await nurse.get(`/api/patients/${ids['LPU-1001']}/labs`)).body.today
})
afterAll(async () => {
  await app?.stop()
  await mail?.stop()
})

const count = async (table: string) => (await sql<{ n: number }>(app, `SELECT COUNT(*) AS n FROM ${table}`))[0]!.n

describe('entering a result', () => {
  it('a nurse records a PSA; it comes back with its interpretation and stays at level none', async () => {
    const reply = await nurse.post(`/api/patients/${ids['LPU-1008']}/labs`, { kind: 'psa', takenOn: today, value: '0.4', note: 'Routine check' })
    expect(reply.status, JSON.stringify(reply.body)).toBe(201)
    expect(reply.body).toMatchObject({ kind: 'psa', value: 0.4, unit: 'ng/mL', note: 'Routine check', enteredBy: 'Nora Lindqvist', level: 'none', reasons: [] })
    // His only value is his nadir; the doubling time is fitted over the values after it (PCWG3, Scher 2016): none yet.
    expect(reply.body.interpretation).toMatchObject({ kind: 'psa', valuesUsed: 0, doubling: { status: 'too-few-values' } })
    expect(await sql(app, 'SELECT id FROM triage_items WHERE source_key = ?', [`lab:${reply.body.id}`])).toHaveLength(0)
  })

  it('a patient cannot record one, even his own (403)', async () => {
    const elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const before = await count('lab_results')
    const reply = await elias.post(`/api/patients/${ids['LPU-1001']}/labs`, { kind: 'hba1c', takenOn: today, value: 5.4 })
    expect(reply.status).toBe(403)
    expect(await count('lab_results')).toBe(before)
  })

  it('bad input answers 400 with a message per field and stores nothing', async () => {
    const before = await count('lab_results')
    const future = new Date(Date.parse(`${today}T12:00:00Z`) + 2 * 86_400_000).toISOString().slice(0, 10)
    const reply = await nurse.post(`/api/patients/${ids['LPU-1008']}/labs`, { kind: 'testosterone', takenOn: future, value: 5000 })
    expect(reply.status).toBe(400)
    expect(reply.body.message).toBe('errors.invalidInput')
    expect(reply.body.data.fieldErrors).toMatchObject({
      takenOn: ['validation.labs.futureDate'],
      unit: ['validation.labs.unitRequired'],
      value: ['validation.labs.valueOutOfRange'],
    })
    const noKind = await nurse.post(`/api/patients/${ids['LPU-1008']}/labs`, { kind: 'potassium', takenOn: today, value: 4 })
    expect(noKind.status).toBe(400)
    expect(noKind.body.data.fieldErrors.kind).toEqual(['validation.labs.kindRequired'])
    const noHeartRate = await nurse.post(`/api/patients/${ids['LPU-1008']}/labs`, { kind: 'qtc', takenOn: today, value: 430, heartRate: '' })
    expect(noHeartRate.body.data.fieldErrors.heartRate).toEqual(['validation.labs.valueRequired'])
    expect(await count('lab_results')).toBe(before)
  })

  it('a testosterone of 80 ng/dL on therapy opens an urgent queue item in the same transaction and alerts the nurses on duty over SMTP', async () => {
    const patientId = ids['LPU-1002']!
    const reply = await nurse.post(`/api/patients/${patientId}/labs`, { kind: 'testosterone', takenOn: today, unit: 'ng/dL', value: 80 })
    expect(reply.status, JSON.stringify(reply.body)).toBe(201)
    expect(reply.body).toMatchObject({ level: 'urgent', reasons: [{ rule: 'testosterone-escape', level: 'urgent', reasonKey: 'labs.rules.testosterone-escape.reason' }] })
    expect(reply.body.reasons[0].source).toMatch(/Oefelein/)
    // 80 ng/dL x 0.03467 = 2.77 nmol/L; not castrate (50 ng/dL), not below 20 ng/dL.
    expect(reply.body.interpretation).toMatchObject({ kind: 'testosterone', ngPerDl: 80, castrate: false, belowStrictLevel: false, onTherapy: true })
    expect(reply.body.interpretation.nmolPerL).toBeCloseTo(2.7736, 3)

    const [item] = await sql<{ id: number, level: string, source: string, status: string, respond_by: string, created_at: string }>(
      app, 'SELECT id, level, source, status, respond_by, created_at FROM triage_items WHERE source_key = ?', [`lab:${reply.body.id}`])
    expect(item).toMatchObject({ level: 'urgent', source: 'lab', status: 'new' })
    // Urgent target: within 4 hours (clinic default).
    expect(new Date(item!.respond_by).getTime() - new Date(item!.created_at).getTime()).toBeGreaterThan(4 * 3600_000 - 5_000)
    expect(new Date(item!.respond_by).getTime() - new Date(item!.created_at).getTime()).toBeLessThanOrEqual(4 * 3600_000 + 5_000)

    const reference = `TW-${String(item!.id).padStart(6, '0')}`
    const alert = await mail.waitFor(m => m.subject.includes(reference) && m.to.includes('nurse@demo.tidewell.test'), 20_000)
    await mail.waitFor(m => m.subject.includes(reference) && m.to.includes('nurse2@demo.tidewell.test'), 20_000)
    expect(alert.text).toContain(`/staff/triage/${item!.id}`)
    expect(`${alert.subject} ${alert.text}`).not.toMatch(/Bernard|Achterberg|LPU-1002|testosterone|ng\/dL/i)

    const queued = (await nurse.get(`/api/triage/${item!.id}`)).body
    expect(queued).toMatchObject({ source: 'lab', level: 'urgent' })
  })

  it('when the queue item cannot be written, the result is not stored either', async () => {
    const results = await count('lab_results')
    const items = await count('triage_items')
    const allowInserts = await refuseInserts(app, 'triage_items')
    try {
      const failed = await nurse.post(`/api/patients/${ids['LPU-1002']}/labs`, { kind: 'qtc', takenOn: today, value: 520, heartRate: 60 })
      expect(failed.status).toBe(500)
      expect(await count('lab_results')).toBe(results)
      expect(await count('triage_items')).toBe(items)
    }
    finally {
      await allowInserts()
    }
  })

  it('an HbA1c of 6.8 % opens a routine item with the routine target', async () => {
    const reply = await nurse.post(`/api/patients/${ids['LPU-1009']}/labs`, { kind: 'hba1c', takenOn: today, value: 6.8 })
    expect(reply.body).toMatchObject({ level: 'routine', reasons: [{ rule: 'a1c-diabetes-range' }] })
    const [item] = await sql<{ level: string, respond_by: string }>(app, 'SELECT level, respond_by FROM triage_items WHERE source_key = ?', [`lab:${reply.body.id}`])
    expect(item!.level).toBe('routine')
    // Three working days: at least three and at most five calendar days later.
    const days = (new Date(item!.respond_by).getTime() - Date.now()) / 86_400_000
    expect(days).toBeGreaterThan(2.9)
    expect(days).toBeLessThan(5.1)
  })
})

describe('reading results', () => {
  it('returns each result newest first with the conversions (Elias, demo seed)', async () => {
    const reply = await nurse.get(`/api/patients/${ids['LPU-1001']}/labs`)
    expect(reply.status).toBe(200)
    const results = reply.body.results as { takenOn: string, kind: string, unit: string, value: number, level: string, interpretation: Record<string, unknown> }[]
    expect(results.length).toBeGreaterThan(3)
    expect([...results].map(r => r.takenOn)).toEqual([...results].map(r => r.takenOn).sort().reverse())
    expect(results.every(r => r.level === 'none')).toBe(true)
    // 0.55 nmol/L / 0.03467 = 15.864 ng/dL (REFERENCES.md, testosterone): castrate and below the stricter 20 ng/dL.
    const nmol = results.find(r => r.kind === 'testosterone' && r.unit === 'nmol/L')!
    expect(nmol.interpretation).toMatchObject({ castrate: true, belowStrictLevel: true })
    expect(nmol.interpretation.ngPerDl as number).toBeCloseTo(15.864, 3)
    // His PSA falls and the latest is the lowest (no value since the nadir): "not rising", never a number.
    const latestPsa = results.find(r => r.kind === 'psa')!
    expect(latestPsa.interpretation).toMatchObject({ valuesUsed: 0, doubling: { status: 'not-rising' } })
    // QT 398 ms at 68 bpm: RR = 60 / 68 = 0.88235 s, cbrt = 0.95914, Fridericia 398 / 0.95914 = 414.96 ms, grade 0.
    const qtc = results.find(r => r.kind === 'qtc')!
    expect(qtc.interpretation.fridericia as number).toBeCloseTo(414.96, 1)
    expect(qtc.interpretation.grade).toBe(0)
  })

  it('gives HbA1c its eAG and IFCC units, and a rising PSA its doubling time', async () => {
    const franklin = (await nurse.get(`/api/patients/${ids['LPU-1005']}/labs`)).body.results as { kind: string, interpretation: Record<string, number> }[]
    const a1c = franklin.find(r => r.kind === 'hba1c')!.interpretation
    // HbA1c 6.8 %: ADAG 28.7 x 6.8 - 46.7 = 195.16 - 46.7 = 148.46 mg/dL; IFCC 10.93 x 6.8 - 23.5 = 74.324 - 23.5 = 50.824 mmol/mol.
    expect(a1c.eagMgDl!).toBeCloseTo(148.46, 2)
    expect(a1c.ifccMmolPerMol!).toBeCloseTo(50.824, 3)
    const odell = (await nurse.get(`/api/patients/${ids['LPU-1004']}/labs`)).body.results as { kind: string, interpretation: { doubling: { status: string, months: number } } }[]
    const psa = odell.find(r => r.kind === 'psa')!.interpretation.doubling
    expect(psa.status).toBe('rising')
    expect(psa.months).toBeGreaterThan(3)
  })

  it('the patient and his caregiver read his results; another patient gets 404', async () => {
    const elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const marisol = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    const augustin = await Client.signIn(app.url, 'augustin@demo.tidewell.test')
    expect((await elias.get(`/api/patients/${ids['LPU-1001']}/labs`)).status).toBe(200)
    expect((await marisol.get(`/api/patients/${ids['LPU-1001']}/labs`)).status).toBe(200)
    const other = await augustin.get(`/api/patients/${ids['LPU-1001']}/labs`)
    expect(other.status).toBe(404)
    expect(JSON.stringify(other.body)).not.toMatch(/psa|testosterone/i)
  })
})
