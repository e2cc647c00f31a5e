import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { diaryEntry } from '../support/diary'
import { MailCatcher } from '../support/mail-catcher'
import { refuseInserts, sql } from '../support/sqlite'

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

const count = async (table: string) => (await sql<{ n: number }>(app, `SELECT COUNT(*) AS n FROM ${table}`))[0]!.n

// Blood in the urine is urgent (issue 4 defaults, common practice).
const urgentEntry = () => diaryEntry({ urinary: { blood: true } })

describe('queue items are created with the entry', () => {
  it('an urgent entry opens an item in the same transaction; when the item cannot be written, neither remains', async () => {
    const patient = await Client.signIn(app.url, 'cyril@demo.tidewell.test')
    const id = ids['LPU-1008']!
    const ok = await patient.post(`/api/patients/${id}/diary`, urgentEntry())
    expect(ok.status).toBe(201)
    expect(ok.body.level).toBe('urgent')
    const [item] = await sql<{ level: string, status: string, respond_by: string }>(app, 'SELECT level, status, respond_by FROM triage_items WHERE diary_entry_id = ?', [ok.body.id])
    expect(item).toMatchObject({ level: 'urgent', status: 'new' })
    // Urgent target: within 4 hours (clinic default).
    expect(new Date(item!.respond_by).getTime() - new Date(ok.body.submittedAt).getTime()).toBe(4 * 3600_000)

    const entriesBefore = await count('diary_entries')
    const itemsBefore = await count('triage_items')
    const allowInserts = await refuseInserts(app, 'triage_items')
    try {
      const failed = await patient.post(`/api/patients/${id}/diary`, urgentEntry())
      expect(failed.status).toBe(500)
      expect(await count('diary_entries')).toBe(entriesBefore)
      expect(await count('triage_items')).toBe(itemsBefore)
    }
    finally {
      await allowInserts()
    }
  })

  it('a quiet entry opens no item, a routine one a review item with the routine target', async () => {
    const patient = await Client.signIn(app.url, 'desmond@demo.tidewell.test')
    // PHQ-2 total >= 3 is a positive screen (Kroenke 2003) -> routine. His first entry, so
    // no baseline to be worse than (a rise of 2 points since the last report raises it).
    const routine = await patient.post(`/api/patients/${ids['LPU-1009']}/diary`, diaryEntry({ mood: { phq2Interest: 2, phq2Down: 1 } }))
    expect(routine.body.level).toBe('routine')
    const [item] = await sql<{ level: string }>(app, 'SELECT level FROM triage_items WHERE diary_entry_id = ?', [routine.body.id])
    expect(item!.level).toBe('routine')
    const quiet = await patient.post(`/api/patients/${ids['LPU-1009']}/diary`, diaryEntry())
    expect(quiet.body.level).toBe('none')
    expect((await sql(app, 'SELECT id FROM triage_items WHERE diary_entry_id = ?', [quiet.body.id]))).toHaveLength(0)
  })
})

describe('alerts', () => {
  it('reach the nurses on duty over SMTP with a reference and link only; with the catcher down they arrive after it returns, exactly once', async () => {
    await mail.stop()
    const patient = await Client.signIn(app.url, 'kenji@demo.tidewell.test')
    const reply = await patient.post(`/api/patients/${ids['LPU-1006']}/diary`, diaryEntry({ heart: { fainting: true } }))
    expect(reply.body.level).toBe('urgent')
    const [item] = await sql<{ id: number }>(app, 'SELECT id FROM triage_items WHERE diary_entry_id = ?', [reply.body.id])
    const reference = `TW-${String(item!.id).padStart(6, '0')}`
    await new Promise(r => setTimeout(r, 1200))
    expect(mail.messages.filter(m => m.subject.includes(reference))).toHaveLength(0)

    await mail.resume()
    const alert = await mail.waitFor(m => m.subject.includes(reference) && m.to.includes('nurse@demo.tidewell.test'), 20_000)
    await mail.waitFor(m => m.subject.includes(reference) && m.to.includes('nurse2@demo.tidewell.test'), 20_000)
    expect(alert.text).toContain(`/staff/triage/${item!.id}`)
    expect(`${alert.subject} ${alert.text}`).not.toMatch(/Kenji|Arakawa|LPU-1006|faint|heart|urine|pain/i)
    await new Promise(r => setTimeout(r, 1500))
    expect(mail.messages.filter(m => m.subject.includes(reference))).toHaveLength(2)
  })
})

describe('escalation task', () => {
  it('escalates an item still new after its respond-by time, once, and never before', async () => {
    const patient = await Client.signIn(app.url, 'ramon@demo.tidewell.test')
    const reply = await patient.post(`/api/patients/${ids['LPU-1007']}/diary`, urgentEntry())
    const [item] = await sql<{ id: number }>(app, 'SELECT id FROM triage_items WHERE diary_entry_id = ?', [reply.body.id])
    const respondBy = new Date(reply.body.respondBy).getTime()
    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    const escalated = async () => (await sql(app, `SELECT id FROM triage_events WHERE item_id = ? AND type = 'escalated'`, [item!.id])).length

    await admin.post('/api/admin/tasks/triage:escalate', { now: new Date(respondBy - 60_000).toISOString() })
    expect(await escalated()).toBe(0)
    await admin.post('/api/admin/tasks/triage:escalate', { now: new Date(respondBy + 60_000).toISOString() })
    expect(await escalated()).toBe(1)
    await admin.post('/api/admin/tasks/triage:escalate', { now: new Date(respondBy + 120_000).toISOString() })
    expect(await escalated()).toBe(1)

    const reference = `TW-${String(item!.id).padStart(6, '0')}`
    const second = await mail.waitFor(m => m.to.includes('clinician@demo.tidewell.test') && m.subject.includes(reference))
    expect(second.subject).toContain('needs a clinician')
    await new Promise(r => setTimeout(r, 800))
    expect(mail.messages.filter(m => m.to.includes('clinician@') && m.subject.includes(reference))).toHaveLength(1)

    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const row = (await nurse.get('/api/triage')).body.items.find((i: { id: number }) => i.id === item!.id)
    expect(row).toMatchObject({ escalated: true })
  })
})

describe('emergency escalation', () => {
  it('an emergency item goes on to the clinicians after its own target (15 minutes, the clinic default), not at the minute it opens; the queue filters escalated items', async () => {
    const patient = await Client.signIn(app.url, 'cyril@demo.tidewell.test')
    const reply = await patient.post(`/api/patients/${ids['LPU-1008']}/diary`, diaryEntry({ rightNow: { newWeakness: true } }))
    expect(reply.body.level).toBe('emergency')
    const [item] = await sql<{ id: number }>(app, 'SELECT id FROM triage_items WHERE diary_entry_id = ?', [reply.body.id])
    // Respond at once: the respond-by time is the minute it came in.
    const opened = new Date(reply.body.respondBy).getTime()
    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    const escalated = async () => (await sql(app, `SELECT id FROM triage_events WHERE item_id = ? AND type = 'escalated'`, [item!.id])).length
    for (const minutes of [1, 14]) {
      await admin.post('/api/admin/tasks/triage:escalate', { now: new Date(opened + minutes * 60_000).toISOString() })
      expect(await escalated(), `${minutes} min`).toBe(0)
    }
    await admin.post('/api/admin/tasks/triage:escalate', { now: new Date(opened + 16 * 60_000).toISOString() })
    expect(await escalated()).toBe(1)

    const clinician = await Client.signIn(app.url, 'clinician@demo.tidewell.test')
    const list = (await clinician.get('/api/triage?status=escalated&pageSize=100')).body.items as { id: number, escalated: boolean }[]
    expect(list.map(i => i.id)).toContain(item!.id)
    expect(list.every(i => i.escalated)).toBe(true)
    const open = (await clinician.get('/api/triage?status=open&pageSize=100')).body.items as { escalated: boolean }[]
    expect(open.some(i => !i.escalated)).toBe(true)
  })
})

describe('the queue', () => {
  it('orders by level, then the respond-by time, with counts per level and filters', async () => {
    const nurse = await Client.signIn(app.url, 'nurse2@demo.tidewell.test')
    const patient = await Client.signIn(app.url, 'franklin@demo.tidewell.test')
    // Chest pain: emergency (common practice); blood in urine: urgent.
    await patient.post(`/api/patients/${ids['LPU-1005']}/diary`, urgentEntry())
    await patient.post(`/api/patients/${ids['LPU-1005']}/diary`, diaryEntry({ rightNow: { chestPain: true } }))
    const queue = (await nurse.get('/api/triage')).body
    const rank = { emergency: 0, urgent: 1, routine: 2 } as Record<string, number>
    for (let i = 1; i < queue.items.length; i++) {
      const [a, b] = [queue.items[i - 1], queue.items[i]]
      expect(rank[a.level]! <= rank[b.level]!).toBe(true)
      if (a.level === b.level && a.respondBy && b.respondBy) expect(a.respondBy <= b.respondBy).toBe(true)
    }
    expect(queue.counts.emergency).toBe(queue.items.filter((i: { level: string }) => i.level === 'emergency').length)
    expect(queue.counts.urgent).toBeGreaterThan(0)

    const urgentOnly = (await nurse.get('/api/triage?level=urgent')).body
    expect(urgentOnly.items.every((i: { level: string }) => i.level === 'urgent')).toBe(true)
    const byName = (await nurse.get('/api/triage?q=Osei')).body
    expect(byName.items.length).toBe(2)
    expect(byName.items.every((i: { patientName: string }) => i.patientName === 'Franklin Osei-Mensah')).toBe(true)
    expect((await nurse.get('/api/triage?assignee=me')).body.items).toHaveLength(0)
    expect((await nurse.get('/api/triage?level=severe')).status).toBe(400)
  })

  it('two nurses taking one unassigned item at the same moment: one 200, one 409, and the item is the winner\'s', async () => {
    const nora = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const tobias = await Client.signIn(app.url, 'nurse2@demo.tidewell.test')
    const patient = await Client.signIn(app.url, 'mateo@demo.tidewell.test')
    const entry = await patient.post(`/api/patients/${ids['LPU-1012']}/diary`, urgentEntry())
    const [{ id }] = await sql<{ id: number }>(app, 'SELECT id FROM triage_items WHERE diary_entry_id = ?', [entry.body.id]) as [{ id: number }]

    // Both saw nobody on it and press "Take it" together.
    const answers = await Promise.all([nora, tobias].map(n => n.post(`/api/triage/${id}/events`, { type: 'claim', from: null })))
    expect(answers.map(a => a.status).sort()).toEqual([200, 409])
    const loser = answers.find(a => a.status === 409)!
    expect(loser.body.message).toBe('errors.triageTakenMeanwhile')
    const winnerName = answers.find(a => a.status === 200)!.body.assignee.name
    const [row] = await sql<{ name: string }>(app, 'SELECT u.name FROM triage_items t JOIN users u ON u.id = t.assignee_user_id WHERE t.id = ?', [id])
    expect(row!.name).toBe(winnerName)
    const claims = await sql<{ n: number }>(app, "SELECT COUNT(*) AS n FROM triage_events WHERE item_id = ? AND type = 'claimed'", [id])
    expect(claims[0]!.n).toBe(1)

    // Taking it over on purpose names the nurse now on it, and works.
    const winnerId = (await sql<{ a: number }>(app, 'SELECT assignee_user_id AS a FROM triage_items WHERE id = ?', [id]))[0]!.a
    const other = answers[0]!.status === 409 ? nora : tobias
    expect((await other.post(`/api/triage/${id}/events`, { type: 'claim', from: winnerId })).status).toBe(200)
  })

  it('claim, call, disposition and close, with the timeline; closing needs a disposition; the patient sees the outcome', async () => {
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const patient = await Client.signIn(app.url, 'mateo@demo.tidewell.test')
    const entry = await patient.post(`/api/patients/${ids['LPU-1012']}/diary`, urgentEntry())
    const [{ id }] = await sql<{ id: number }>(app, 'SELECT id FROM triage_items WHERE diary_entry_id = ?', [entry.body.id]) as [{ id: number }]

    const claimed = await nurse.post(`/api/triage/${id}/events`, { type: 'claim' })
    expect(claimed.body).toMatchObject({ status: 'in-progress', assignee: { name: 'Nora Lindqvist' } })
    expect((await nurse.get('/api/triage?assignee=me')).body.items.map((i: { id: number }) => i.id)).toContain(id)
    await nurse.post(`/api/triage/${id}/events`, { type: 'call', reached: false })
    await nurse.post(`/api/triage/${id}/events`, { type: 'call', reached: true, note: 'Spoke with him; visit tomorrow.' })
    const refused = await nurse.post(`/api/triage/${id}/events`, { type: 'close' })
    expect(refused.status).toBe(400)
    expect(refused.body.message).toBe('errors.dispositionRequired')
    expect((await nurse.post(`/api/triage/${id}/events`, { type: 'disposition', disposition: 'made-up' })).status).toBe(400)
    await nurse.post(`/api/triage/${id}/events`, { type: 'disposition', disposition: 'visit-booked' })
    const closed = await nurse.post(`/api/triage/${id}/events`, { type: 'close' })
    expect(closed.status).toBe(200)
    expect(closed.body.status).toBe('closed')
    expect(closed.body.events.map((e: { type: string }) => e.type)).toEqual(['created', 'claimed', 'call-attempted', 'call-reached', 'disposition-set', 'closed'])
    expect(closed.body.entry.enteredBy).toEqual({ name: 'Mateo Quiñones Reyes', relation: 'self' })
    expect((await nurse.post(`/api/triage/${id}/events`, { type: 'claim' })).status).toBe(409)

    const history = (await patient.get(`/api/patients/${ids['LPU-1012']}/diary`)).body.entries
    expect(history[0].review).toEqual({ status: 'closed', disposition: 'visit-booked', closedAt: expect.any(String) })
    expect(Date.parse(history[0].review.closedAt)).toBeGreaterThanOrEqual(Date.parse(history[0].submittedAt))

    const audit = await sql<{ action: string }>(app, `SELECT action FROM audit_events WHERE patient_id = ? AND action = 'triage.work'`, [ids['LPU-1012']])
    expect(audit.length).toBeGreaterThanOrEqual(6)
  })

  it('patients, caregivers and admins get 403 on every queue route', async () => {
    for (const email of ['patient@demo.tidewell.test', 'caregiver@demo.tidewell.test', 'admin@demo.tidewell.test']) {
      const client = await Client.signIn(app.url, email)
      expect((await client.get('/api/triage')).status).toBe(403)
      expect((await client.get('/api/triage/1')).status).toBe(403)
      expect((await client.post('/api/triage/1/events', { type: 'claim' })).status).toBe(403)
    }
  })
})

describe('overdue injections', () => {
  it('open one urgent item per missed cycle', async () => {
    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    const first = await admin.post('/api/admin/tasks/triage:overdue', {})
    expect(first.status).toBe(200)
    const items = await sql<{ patient_id: number, level: string }>(app, `SELECT patient_id, level FROM triage_items WHERE source = 'overdue-injection'`)
    expect(items.length).toBe(first.body.result.opened)
    expect(items.every(i => i.level === 'urgent')).toBe(true)
    const again = await admin.post('/api/admin/tasks/triage:overdue', {})
    expect(again.body.result.opened).toBe(0)
  })
})
