import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { diaryEntry } from '../support/diary'
import { MailCatcher } from '../support/mail-catcher'
import { sql } from '../support/sqlite'

/*
 * Issue 9: a right-now "yes" reaches the nurses the moment it is answered, before the rest
 * of the diary, and the rest joins the same entry and item; the same report twice stores
 * one entry; a note alone is read by a person.
 */

let app: RunningApp
let mail: MailCatcher
let ids: Record<string, number>
const NURSES_ON_DUTY = ['nurse@demo.tidewell.test', 'nurse2@demo.tidewell.test']

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

const entriesOf = (patientId: number) => sql<{ id: number, complete: number, level: string, draft_id: string | null }>(app, 'SELECT id, complete, level, draft_id FROM diary_entries WHERE patient_id = ?', [patientId])
const itemsOf = (patientId: number) => sql<{ id: number, level: string, diary_entry_id: number, reasons: string, status: string }>(app, 'SELECT id, level, diary_entry_id, reasons, status FROM triage_items WHERE patient_id = ?', [patientId])
const alertsFor = (itemId: number) => sql<{ to_address: string }>(app, `SELECT dedupe_key FROM outbox_messages WHERE dedupe_key LIKE ?`, [`triageAlert:${itemId}:%`])
const eventsOf = (itemId: number) => sql<{ type: string }>(app, 'SELECT type FROM triage_events WHERE item_id = ? ORDER BY id', [itemId])

describe('POST /api/patients/:id/diary/right-now', () => {
  it('a yes sent alone opens an incomplete emergency entry and its item, and the alert reaches the nurses on duty', async () => {
    const patient = await Client.signIn(app.url, 'odell@demo.tidewell.test')
    const id = ids['LPU-1004']!
    const draftId = randomUUID()
    const reply = await patient.post(`/api/patients/${id}/diary/right-now`, { draftId, items: ['chestPain'] })
    expect(reply.status, JSON.stringify(reply.body)).toBe(201)
    // Chest pain now is an emergency (common practice, emergency care)
    expect(reply.body).toMatchObject({ complete: false, level: 'emergency', patientId: id })
    expect(reply.body.answers.rightNow.chestPain).toBe(true)
    expect(reply.body.answers.rightNow.newWeakness).toBe(false)
    expect(reply.body.rulesVersion).toMatch(/^tidewell-triage-/)
    expect(reply.body.review).toMatchObject({ status: 'new', disposition: null, closedAt: null })
    const [item, ...more] = await itemsOf(id)
    expect(more).toHaveLength(0)
    expect(item).toMatchObject({ level: 'emergency', diary_entry_id: reply.body.id })
    const alerts = await Promise.all(NURSES_ON_DUTY.map(to => mail.waitFor(m => m.to.includes(to) && m.subject.includes(`TW-${String(item!.id).padStart(6, '0')}`))))
    for (const alert of alerts) expect(alert.text).toContain(`/staff/triage/${item!.id}`)
    // The nurse sees it in the queue without the rest of the diary ever arriving.
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const queue = (await nurse.get('/api/triage')).body.items as { id: number, level: string }[]
    expect(queue.find(row => row.id === item!.id)?.level).toBe('emergency')
  })

  it('the rest of the diary with the same draft id joins the same entry and item: one entry, one item, one alert per nurse', async () => {
    const patient = await Client.signIn(app.url, 'franklin@demo.tidewell.test')
    const id = ids['LPU-1005']!
    const draftId = randomUUID()
    const first = await patient.post(`/api/patients/${id}/diary/right-now`, { draftId, items: ['hardToBreathe'] })
    expect(first.status).toBe(201)
    const again = await patient.post(`/api/patients/${id}/diary/right-now`, { draftId, items: ['hardToBreathe', 'chestPain'] })
    expect(again.status).toBe(200)
    expect(again.body.id).toBe(first.body.id)
    expect(again.body.answers.rightNow).toMatchObject({ hardToBreathe: true, chestPain: true })

    // The page sends the rest with every right-now answer "no" (say, a stale copy): the yes already sent stays.
    const rest = await patient.post(`/api/patients/${id}/diary`, { ...diaryEntry({ urinary: { blood: true }, note: 'Coughing at night.' }), draftId })
    expect(rest.status, JSON.stringify(rest.body)).toBe(200)
    expect(rest.body).toMatchObject({ id: first.body.id, complete: true, level: 'emergency' })
    expect(rest.body.answers.rightNow).toMatchObject({ hardToBreathe: true, chestPain: true })
    expect(rest.body.answers.urinary.blood).toBe(true)
    expect(rest.body.answers.note).toBe('Coughing at night.')
    const rules = (rest.body.reasons as { rule: string }[]).map(r => r.rule)
    // Blood in the urine is urgent (issue 4 defaults, common practice): its reason joins the emergency ones.
    expect(rules.length).toBeGreaterThan((first.body.reasons as unknown[]).length)
    expect(rest.body.reasons[0].level).toBe('emergency')

    const entries = await entriesOf(id)
    expect(entries).toHaveLength(1)
    expect(entries[0]).toMatchObject({ complete: 1, level: 'emergency', draft_id: draftId })
    const items = await itemsOf(id)
    expect(items).toHaveLength(1)
    expect(items[0]!.level).toBe('emergency')
    expect(JSON.parse(items[0]!.reasons).map((r: { rule: string }) => r.rule)).toEqual(expect.arrayContaining(rules))
    expect((await alertsFor(items[0]!.id)).length).toBe(NURSES_ON_DUTY.length)
    expect((await eventsOf(items[0]!.id)).map(e => e.type)).toEqual(['created', 'right-now-added', 'diary-completed'])
  })

  it('a double submit of the same draft stores one entry and answers the second with it unchanged', async () => {
    const patient = await Client.signIn(app.url, 'kenji@demo.tidewell.test')
    const id = ids['LPU-1006']!
    const draftId = randomUUID()
    const body = { ...diaryEntry({ pain: { worst: 3, locations: ['hips'] } }), draftId }
    const first = await patient.post(`/api/patients/${id}/diary`, body)
    expect(first.status).toBe(201)
    expect(first.body.complete).toBe(true)
    const second = await patient.post(`/api/patients/${id}/diary`, { ...body, pain: { ...body.pain, worst: 9 } })
    expect(second.status).toBe(200)
    expect(second.body).toEqual(first.body)
    const [a, b] = await Promise.all([1, 2].map(() => patient.post(`/api/patients/${id}/diary`, { ...diaryEntry(), draftId: randomUUID() })))
    expect([a!.status, b!.status]).toEqual([201, 201])
    expect(await entriesOf(id)).toHaveLength(3)
  })

  it('two right-now reports with one draft id at the same moment give one entry and one item', async () => {
    const patient = await Client.signIn(app.url, 'cyril@demo.tidewell.test')
    const id = ids['LPU-1008']!
    const draftId = randomUUID()
    const replies = await Promise.all([['seizure'], ['seizure'], ['faceDroopSpeech'], ['seizure']].map(items => patient.post(`/api/patients/${id}/diary/right-now`, { draftId, items })))
    expect(replies.map(r => r.status).sort()).toEqual([200, 200, 200, 201])
    expect(new Set(replies.map(r => r.body.id)).size).toBe(1)
    expect(await entriesOf(id)).toHaveLength(1)
    const items = await itemsOf(id)
    expect(items).toHaveLength(1)
    const stored = await patient.get(`/api/patients/${id}/diary/${replies[0]!.body.id}`)
    expect(stored.body.answers.rightNow).toMatchObject({ seizure: true, faceDroopSpeech: true })
    expect((await alertsFor(items[0]!.id)).length).toBe(NURSES_ON_DUTY.length)
  })

  it('eight diaries and right-now reports sent at the same moment are all stored', async () => {
    const patient = await Client.signIn(app.url, 'mateo@demo.tidewell.test')
    const id = ids['LPU-1012']!
    const before = (await entriesOf(id)).length
    const replies = await Promise.all(Array.from({ length: 8 }, (_, n) => n % 2
      ? patient.post(`/api/patients/${id}/diary/right-now`, { draftId: randomUUID(), items: ['chestPain'] })
      : patient.post(`/api/patients/${id}/diary`, { ...diaryEntry(), draftId: randomUUID() })))
    expect(replies.map(r => r.status)).toEqual([201, 201, 201, 201, 201, 201, 201, 201])
    expect((await entriesOf(id)).length).toBe(before + 8)
    expect((await itemsOf(id)).length).toBe(4)
  }, 30_000)

  it('a caregiver\'s right-now yes does the same, and only with the grant to log', async () => {
    const viewOnly = await Client.signIn(app.url, 'dana@demo.tidewell.test')
    expect((await viewOnly.post(`/api/patients/${ids['LPU-1002']}/diary/right-now`, { draftId: randomUUID(), items: ['newWeakness'] })).status).toBe(403)
    const helper = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    const id = ids['LPU-1001']!
    const reply = await helper.post(`/api/patients/${id}/diary/right-now`, { draftId: randomUUID(), items: ['newWeakness'] })
    expect(reply.status).toBe(201)
    // NICE NG234: new limb weakness -> immediate (emergency)
    expect(reply.body).toMatchObject({ level: 'emergency', complete: false, enteredBy: { name: 'Marisol Marwood', relation: 'caregiver' } })
    const [item] = await itemsOf(id)
    expect(item).toMatchObject({ level: 'emergency', diary_entry_id: reply.body.id })
    await Promise.all(NURSES_ON_DUTY.map(to => mail.waitFor(m => m.to.includes(to) && m.subject.includes(`TW-${String(item!.id).padStart(6, '0')}`))))
  })

  it('refuses a report with no items, an unknown item or no draft id, and another patient\'s record answers 404', async () => {
    const patient = await Client.signIn(app.url, 'desmond@demo.tidewell.test')
    const id = ids['LPU-1009']!
    for (const body of [{ draftId: randomUUID(), items: [] }, { draftId: randomUUID(), items: ['hiccups'] }, { items: ['chestPain'] }, { draftId: 'not-a-uuid', items: ['chestPain'] }]) {
      const reply = await patient.post(`/api/patients/${id}/diary/right-now`, body)
      expect(reply.status, JSON.stringify(body)).toBe(400)
      expect(reply.body.message).toBe('errors.invalidInput')
    }
    expect((await patient.post(`/api/patients/${ids['LPU-1011']}/diary/right-now`, { draftId: randomUUID(), items: ['chestPain'] })).status).toBe(404)
    expect(await entriesOf(id)).toHaveLength(0)
    expect(await entriesOf(ids['LPU-1011']!)).toHaveLength(0)
  })

  it('the entry shows the care team\'s outcome once the item is closed', async () => {
    const patient = await Client.signIn(app.url, 'ramon@demo.tidewell.test')
    const id = ids['LPU-1007']!
    const opened = await patient.post(`/api/patients/${id}/diary/right-now`, { draftId: randomUUID(), items: ['cannotPassUrine'] })
    const [item] = await itemsOf(id)
    const nurse = await Client.signIn(app.url, 'nurse2@demo.tidewell.test')
    expect((await nurse.post(`/api/triage/${item!.id}/events`, { type: 'disposition', disposition: 'sent-to-emergency' })).status).toBe(200)
    expect((await nurse.post(`/api/triage/${item!.id}/events`, { type: 'close' })).status).toBe(200)
    const entry = await patient.get(`/api/patients/${id}/diary/${opened.body.id}`)
    expect(entry.body.review).toMatchObject({ status: 'closed', disposition: 'sent-to-emergency' })
    expect(Date.parse(entry.body.review.closedAt)).toBeGreaterThanOrEqual(Date.parse(opened.body.submittedAt))
    const list = await patient.get(`/api/patients/${id}/diary`)
    expect(list.body.entries[0].review.closedAt).toBe(entry.body.review.closedAt)
  })
})

describe('the rest of the diary after the nurse closed the item', () => {
  it('adds nothing new: the item stays closed; brings a new reason: the item opens again and the nurses are alerted again', async () => {
    const patient = await Client.signIn(app.url, 'howard@demo.tidewell.test')
    const id = ids['LPU-1011']!
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const close = async (itemId: number) => {
      expect((await nurse.post(`/api/triage/${itemId}/events`, { type: 'disposition', disposition: 'sent-to-emergency' })).status).toBe(200)
      expect((await nurse.post(`/api/triage/${itemId}/events`, { type: 'close' })).status).toBe(200)
    }

    const quietDraft = randomUUID()
    const quiet = await patient.post(`/api/patients/${id}/diary/right-now`, { draftId: quietDraft, items: ['hardToBreathe'] })
    const [first] = await itemsOf(id)
    await close(first!.id)
    const rest = await patient.post(`/api/patients/${id}/diary`, { ...diaryEntry(), draftId: quietDraft })
    expect(rest.status).toBe(200)
    expect(rest.body.review).toMatchObject({ status: 'closed', disposition: 'sent-to-emergency' })
    expect((await alertsFor(first!.id)).length).toBe(NURSES_ON_DUTY.length)
    expect(quiet.body.id).toBe(rest.body.id)

    const draftId = randomUUID()
    const opened = await patient.post(`/api/patients/${id}/diary/right-now`, { draftId, items: ['chestPain'] })
    const second = (await itemsOf(id)).find(item => item.diary_entry_id === opened.body.id)!
    await close(second.id)
    // Blood in the urine is urgent (issue 4 defaults, common practice): a reason the closed item did not have.
    const more = await patient.post(`/api/patients/${id}/diary`, { ...diaryEntry({ urinary: { blood: true } }), draftId })
    expect(more.status).toBe(200)
    expect(more.body.review).toMatchObject({ status: 'new', closedAt: null })
    expect((await alertsFor(second.id)).length).toBe(2 * NURSES_ON_DUTY.length)
    const detail = (await nurse.get(`/api/triage/${second.id}`)).body
    expect(detail.status).toBe('new')
    expect(detail.events.at(-1)).toMatchObject({ type: 'diary-completed', data: { reopened: true } })
  })
})

describe('a note is read by a person', () => {
  it('a note alone opens a routine item, and note-read records the event', async () => {
    const patient = await Client.signIn(app.url, 'bernard@demo.tidewell.test')
    const id = ids['LPU-1002']!
    const reply = await patient.post(`/api/patients/${id}/diary`, diaryEntry({ note: 'My legs gave way on the stairs last night.' }))
    expect(reply.status).toBe(201)
    expect(reply.body.level).toBe('routine')
    expect(reply.body.reasons.map((r: { rule: string }) => r.rule)).toContain('note-to-read')
    const [item, ...more] = await itemsOf(id)
    expect(more).toHaveLength(0)
    expect(item!.level).toBe('routine')
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    expect((await nurse.get(`/api/triage/${item!.id}`)).body.noteRead).toBe(false)
    const read = await nurse.post(`/api/triage/${item!.id}/events`, { type: 'note-read' })
    expect(read.status, JSON.stringify(read.body)).toBe(200)
    expect(read.body.noteRead).toBe(true)
    expect(read.body.events.map((e: { type: string }) => e.type)).toEqual(['created', 'note-read'])
  })

  it('note-read is refused on an item with no note', async () => {
    const patient = await Client.signIn(app.url, 'luis@demo.tidewell.test')
    const id = ids['LPU-1003']!
    // Blood in the urine is urgent (issue 4 defaults, common practice)
    await patient.post(`/api/patients/${id}/diary`, diaryEntry({ urinary: { blood: true } }))
    const [item] = await itemsOf(id)
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const refused = await nurse.post(`/api/triage/${item!.id}/events`, { type: 'note-read' })
    expect(refused.status).toBe(409)
    expect(refused.body.message).toBe('errors.noNoteToRead')
    expect((await eventsOf(item!.id)).map(e => e.type)).toEqual(['created'])
  })
})
