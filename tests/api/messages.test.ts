import { randomUUID } from 'node:crypto'
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join } from 'node:path'
import exifr from 'exifr'
import { PDFDocument } from 'pdf-lib'
import sharp from 'sharp'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { addCaregiver, patientIds } from '../support/circle'
import { Client } from '../support/client'
import { MailCatcher } from '../support/mail-catcher'

/*
 * Issue 13, messages and attachments, through the built server: who may read and write,
 * the right-now check before a message (a yes stores no message and opens an emergency
 * item), one routine queue item per thread while open, entered in error (kept for staff,
 * gone from the patient's view), unread counts and read receipts, e-mails that carry no
 * content and no patient name, and files checked by their bytes, kept in the local
 * S3 stand-in and served only as downloads through the access policy.
 */

let app: RunningApp
let mail: MailCatcher
let ids: Record<string, number>
let patientId: number
let howard: Client
let helper: Client
let viewer: Client
let otherPatient: Client
let nurse: Client
let clinician: Client
let admin: Client

const HOWARD = 'Howard Tillinghast'

beforeAll(async () => {
  mail = await MailCatcher.start()
  app = await startApp({ smtpUrl: mail.url })
  ids = await patientIds(app.url)
  patientId = ids['LPU-1011']!
  howard = await Client.signIn(app.url, 'howard@demo.tidewell.test')
  helper = (await addCaregiver(app.url, mail, howard, patientId, { name: 'Wilhelmina Tillinghast', email: 'wilhelmina@demo.tidewell.test', canMessage: true })).caregiver
  viewer = (await addCaregiver(app.url, mail, howard, patientId, { name: 'Percival Tillinghast', email: 'percival@demo.tidewell.test', canLogDiary: true, canManageAppointments: true })).caregiver
  otherPatient = await Client.signIn(app.url, 'augustin@demo.tidewell.test')
  nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
  clinician = await Client.signIn(app.url, 'clinician@demo.tidewell.test')
  admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
})
afterAll(async () => {
  await app?.stop()
  await mail?.stop()
})

const url = () => `/api/patients/${patientId}/messages`
const send = (by: Client, body: Record<string, unknown>) => by.post(url(), { rightNow: [], requestId: randomUUID(), ...body })

async function messageItems(): Promise<{ id: number, source: string, level: string, respondBy: string }[]> {
  const queue = (await nurse.get('/api/triage?pageSize=100')).body.items as { id: number, patientId: number, source: string, level: string, respondBy: string }[]
  return queue.filter(item => item.patientId === patientId && item.source === 'message')
}

/** Uploads one file as a browser form would (multipart, the app's own Origin, the session cookie). */
async function upload(by: Client, bytes: Buffer, name: string, type = 'application/octet-stream', to = patientId) {
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(bytes)], { type }), name)
  const response = await fetch(new URL(`/api/patients/${to}/attachments`, app.url), {
    method: 'POST',
    headers: { origin: new URL(app.url).origin, cookie: by.cookieHeader() },
    body: form,
  })
  return { status: response.status, body: await response.json() }
}

async function download(by: Client, id: number) {
  const response = await fetch(new URL(`/api/attachments/${id}`, app.url), { headers: { cookie: by.cookieHeader() } })
  return { status: response.status, headers: response.headers, bytes: Buffer.from(await response.arrayBuffer()) }
}

async function pdfBytes(pages = 1) {
  const document = await PDFDocument.create()
  for (let i = 0; i < pages; i++) document.addPage()
  return Buffer.from(await document.save())
}

describe('who may read and write messages', () => {
  const cases: [string, () => Client, number, number][] = [
    // who, client, GET, POST with an empty body (400: the policy let it through to validation)
    ['the patient', () => howard, 200, 400],
    ['a caregiver allowed to message', () => helper, 200, 400],
    ['a caregiver without that permission', () => viewer, 403, 403],
    ['another patient', () => otherPatient, 404, 404],
    ['a nurse', () => nurse, 200, 400],
    ['a clinician', () => clinician, 200, 400],
    ['an admin', () => admin, 403, 403],
  ]
  for (const [who, client, read, write] of cases) {
    it(`${who}: GET ${read}, POST ${write}`, async () => {
      expect((await client().get(url())).status).toBe(read)
      expect((await client().post(url(), {})).status).toBe(write)
    })
  }

  it('the permission shows in the caregiver\'s list of records', async () => {
    expect((await helper.get('/api/me/patients')).body[0]).toMatchObject({ patientId, canMessage: true })
    expect((await viewer.get('/api/me/patients')).body[0]).toMatchObject({ patientId, canMessage: false })
  })

  it('the right-now answer must be sent: a message without it is refused at the field', async () => {
    const reply = await howard.post(url(), { subject: 'Hello', body: 'A question', requestId: randomUUID() })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors.rightNow).toEqual(['validation.messages.rightNowRequired'])
  })
})

describe('the right-now check before a message', () => {
  it('a yes stores no message and opens an emergency item with the alert, as the diary does', async () => {
    const before = mail.messages.length
    const reply = await send(helper, { subject: 'Chest', body: 'He has a crushing pain in his chest', rightNow: ['chestPain'] })
    expect(reply.status).toBe(202)
    expect(reply.body).toEqual({ rightNow: true, entryId: expect.any(Number) })
    expect((await howard.get(url())).body.threads).toEqual([])
    const entry = (await nurse.get(`/api/patients/${patientId}/diary/${reply.body.entryId}`)).body
    expect(entry).toMatchObject({ level: 'emergency', complete: false, enteredBy: { name: 'Wilhelmina Tillinghast', relation: 'caregiver' } })
    const queue = (await nurse.get('/api/triage?pageSize=100')).body.items as { patientId: number, source: string, level: string }[]
    expect(queue.filter(i => i.patientId === patientId && i.level === 'emergency' && i.source === 'diary')).toHaveLength(1)
    const alert = await mail.waitFor(m => mail.messages.indexOf(m) >= before && m.to.includes('nurse@demo.tidewell.test') && /emergency/i.test(m.subject))
    expect(alert.text).not.toContain('crushing')
  })

  it('the same request again opens nothing more', async () => {
    const requestId = randomUUID()
    const first = await send(howard, { subject: 'Walk', body: 'My legs gave way', rightNow: ['troubleWalking'], requestId })
    const again = await send(howard, { subject: 'Walk', body: 'My legs gave way', rightNow: ['troubleWalking'], requestId })
    expect(first.status).toBe(202)
    expect(again.body.entryId).toBe(first.body.entryId)
  })

  it('staff do not answer the right-now check', async () => {
    const reply = await send(nurse, { subject: 'x', body: 'y', rightNow: ['chestPain'] })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors.rightNow).toEqual(['validation.messages.rightNowStaff'])
  })
})

describe('a conversation', () => {
  let threadId: number
  let firstMessageId: number
  const BODY = 'The rash near the injection site is itchy since Tuesday'

  it('a message from the circle opens one routine queue item with the routine target, and e-mails the nurses on duty without its content', async () => {
    const before = mail.messages.length
    const reply = await send(howard, { subject: 'Rash', body: BODY })
    expect(reply.status).toBe(201)
    expect(reply.body).toMatchObject({ body: BODY, mine: true, author: { name: HOWARD, relation: 'self', onBehalf: false } })
    threadId = reply.body.threadId
    firstMessageId = reply.body.id
    const items = await messageItems()
    expect(items).toHaveLength(1)
    expect(items[0]).toMatchObject({ level: 'routine' })
    // Routine target: working days ahead (clinic setting, 3 by default), never at once.
    expect(Date.parse(items[0]!.respondBy) - Date.now()).toBeGreaterThan(24 * 3600_000)
    const sent = await mail.waitFor(m => mail.messages.indexOf(m) >= before && m.to.includes('nurse@demo.tidewell.test') && /message/i.test(m.subject))
    for (const part of [sent.text, sent.html, sent.subject]) {
      expect(part).not.toContain('rash')
      expect(part).not.toContain('Rash')
      expect(part).not.toContain(HOWARD)
    }
  })

  it('the item names its conversation for the item page (messageThreadId, from its source key)', async () => {
    const [item] = await messageItems()
    expect((await nurse.get(`/api/triage/${item!.id}`)).body.messageThreadId).toBe(threadId)
  })

  it('the same requestId again returns the first message, 200, and stores nothing more', async () => {
    const requestId = randomUUID()
    const first = await send(helper, { threadId, body: 'Also a little swollen', requestId })
    const again = await send(helper, { threadId, body: 'Also a little swollen', requestId })
    expect([first.status, again.status]).toEqual([201, 200])
    expect(again.body.id).toBe(first.body.id)
    expect(first.body.author).toMatchObject({ name: 'Wilhelmina Tillinghast', relation: 'caregiver', onBehalf: true })
  })

  it('another message in the thread joins the open item instead of opening a second', async () => {
    expect((await send(howard, { threadId, body: 'It is spreading a bit' })).status).toBe(201)
    expect(await messageItems()).toHaveLength(1)
  })

  it('a thread or a subject, never both and never neither', async () => {
    expect((await send(howard, { body: 'x' })).body.data.fieldErrors.subject).toEqual(['validation.messages.threadOrSubject'])
    expect((await send(howard, { threadId, subject: 'x', body: 'x' })).status).toBe(400)
  })

  it('another patient\'s thread is not found', async () => {
    const augustinId = ids['LPU-1010']!
    const reply = await otherPatient.post(`/api/patients/${augustinId}/messages`, { threadId, body: 'x', rightNow: [], requestId: randomUUID() })
    expect(reply.status).toBe(404)
  })

  it('a staff answer e-mails the patient and the caregiver allowed to message, not the one without, with no content', async () => {
    const before = mail.messages.length
    const reply = await send(nurse, { threadId, body: 'Please send us a photo of the rash' })
    expect(reply.status).toBe(201)
    expect(reply.body.author).toMatchObject({ name: 'Nora Lindqvist', relation: 'staff', onBehalf: true })
    const toHoward = await mail.waitFor(m => mail.messages.indexOf(m) >= before && m.to.includes('howard@demo.tidewell.test'))
    const toHelper = await mail.waitFor(m => mail.messages.indexOf(m) >= before && m.to.includes('wilhelmina@demo.tidewell.test'))
    for (const sent of [toHoward, toHelper]) {
      expect(sent.text).not.toContain('photo of the rash')
      expect(sent.html).not.toContain('photo of the rash')
    }
    expect(toHelper.text).not.toContain(HOWARD)
    await new Promise(r => setTimeout(r, 1000))
    expect(mail.messages.slice(before).some(m => m.to.includes('percival@demo.tidewell.test'))).toBe(false)
  })

  it('unread counts and read receipts', async () => {
    expect((await howard.get('/api/me/unread')).body.unread).toBe(2) // the caregiver's and the nurse's
    const view = (await howard.get(url())).body
    expect(view.threads[0]).toMatchObject({ id: threadId, unread: 2 })
    // The circle sees no read receipts or entered-in-error marks.
    expect(view.threads[0].messages[0].readBy).toBeUndefined()
    expect(view.threads[0].messages[0].enteredInError).toBeUndefined()
    expect((await howard.post(`${url()}/read`, { threadId })).body.marked).toBe(2)
    expect((await howard.get('/api/me/unread')).body.unread).toBe(0)
    const staffView = (await clinician.get(url())).body
    const answer = staffView.threads[0].messages.find((m: { author: { relation: string } }) => m.author.relation === 'staff')
    expect(answer.readBy).toEqual([{ name: HOWARD, relation: 'self', readAt: expect.any(String) }])
  })

  it('for the care team a circle message stays unread until one of them reads it', async () => {
    const before = (await clinician.get('/api/me/unread')).body.unread
    expect(before).toBeGreaterThanOrEqual(3)
    await nurse.post(`${url()}/read`, { threadId })
    expect((await clinician.get('/api/me/unread')).body.unread).toBe(before - 3)
    expect((await admin.get('/api/me/unread')).body.unread).toBe(0)
  })

  it('entered in error: kept and marked for staff, gone from the patient\'s view, audited; nobody deletes a message', async () => {
    const path = `/api/messages/${firstMessageId}/entered-in-error`
    expect((await helper.post(path, { reason: 'x' })).status).toBe(403)
    expect((await admin.post(path, { reason: 'x' })).status).toBe(403)
    expect((await nurse.post(path, {})).status).toBe(400)
    const marked = await nurse.post(path, { reason: 'Sent for the wrong patient' })
    expect(marked.status).toBe(200)
    expect((await clinician.post(path, { reason: 'again' })).status).toBe(409)
    const circle = (await howard.get(url())).body.threads[0].messages as { id: number }[]
    expect(circle.map(m => m.id)).not.toContain(firstMessageId)
    const staff = (await nurse.get(url())).body.threads[0].messages as { id: number, body: string, enteredInError: unknown }[]
    expect(staff.find(m => m.id === firstMessageId)).toMatchObject({ body: BODY, enteredInError: { by: 'Nora Lindqvist', reason: 'Sent for the wrong patient' } })
    expect((await nurse.delete(`/api/messages/${firstMessageId}`)).status).toBe(404)
    const audit = await admin.get(`/api/audit?action=message.entered-in-error&patient=${patientId}`)
    expect(audit.status).toBe(200)
    expect(audit.body.total).toBe(1)
  })
})

describe('attachments', () => {
  it('an HTML file named .jpg is refused by its bytes (415)', async () => {
    const html = Buffer.from('<!doctype html><html><body><script>alert(1)</script></body></html>')
    const reply = await upload(howard, html, 'rash.jpg', 'image/jpeg')
    expect(reply.status).toBe(415)
    expect(reply.body.data.fieldErrors.file).toEqual(['validation.attachments.type'])
  })

  it('a PDF named .txt is a PDF: stored through the stand-in, read back byte for byte as a download with nosniff', async () => {
    const bytes = await pdfBytes(2)
    const stored = await upload(helper, bytes, 'outside-lab.txt', 'text/plain')
    expect(stored.status).toBe(201)
    expect(stored.body).toMatchObject({ kind: 'pdf', mime: 'application/pdf', fileName: 'outside-lab.pdf', pages: 2, byteSize: bytes.length })
    // Pending: not even the nurse sees it before it is sent.
    expect((await download(nurse, stored.body.id)).status).toBe(404)
    expect((await send(helper, { subject: 'Letter', body: 'The letter from the other hospital', attachmentIds: [stored.body.id] })).status).toBe(201)
    for (const reader of [howard, nurse]) {
      const got = await download(reader, stored.body.id)
      expect(got.status).toBe(200)
      expect(got.headers.get('content-type')).toBe('application/pdf')
      expect(got.headers.get('content-disposition')).toMatch(/^attachment; filename="outside-lab\.pdf"/)
      expect(got.headers.get('x-content-type-options')).toBe('nosniff')
      expect(got.bytes.equals(bytes)).toBe(true)
    }
    // The bytes went through the S3 stand-in: its folder beside the database holds them.
    const files = (dir: string): string[] => readdirSync(dir).flatMap(name => statSync(join(dir, name)).isDirectory() ? files(join(dir, name)) : [join(dir, name)])
    expect(files(join(app.dataDir, 'objects')).some(file => readFileSync(file).equals(bytes))).toBe(true)
  })

  it('a photo with a GPS position comes back without it (read with exifr)', async () => {
    const photo = await sharp({ create: { width: 60, height: 40, channels: 3, background: '#bb5544' } })
      .jpeg()
      .withExif({ IFD0: { Make: 'TestCam' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '43/1 2/1 30/1', GPSLongitudeRef: 'W', GPSLongitude: '87/1 54/1 0/1' } })
      .toBuffer()
    expect(await exifr.gps(photo)).toBeTruthy()
    const stored = await upload(howard, photo, 'rash.jpeg', 'image/jpeg')
    expect(stored.status).toBe(201)
    expect(stored.body).toMatchObject({ kind: 'image', mime: 'image/jpeg', width: 60, height: 40 })
    expect((await send(howard, { subject: 'Photo', body: 'Here is the photo', attachmentIds: [stored.body.id] })).status).toBe(201)
    const got = await download(nurse, stored.body.id)
    expect(got.status).toBe(200)
    expect(await exifr.gps(got.bytes)).toBeUndefined()
  })

  it('only one\'s own pending upload can be sent with a message', async () => {
    const stored = await upload(howard, await pdfBytes(), 'mine.pdf')
    const reply = await send(helper, { subject: 'Not his', body: 'x', attachmentIds: [stored.body.id] })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors.attachmentIds).toEqual(['validation.messages.attachment'])
  })

  it('another patient\'s attachment is 404; a caregiver without the permission 403; an unknown one 404', async () => {
    const stored = await upload(howard, await pdfBytes(), 'private.pdf')
    await send(howard, { subject: 'Private', body: 'x', attachmentIds: [stored.body.id] })
    expect((await download(otherPatient, stored.body.id)).status).toBe(404)
    expect((await download(viewer, stored.body.id)).status).toBe(403)
    expect((await download(howard, 999_999)).status).toBe(404)
    expect((await upload(otherPatient, await pdfBytes(), 'x.pdf')).status).toBe(404)
  })

  it('an upload over 10 MB plus the multipart framing answers 413 before it is read; a JSON body elsewhere keeps 64 kB', async () => {
    const limit = 10 * 1024 * 1024 + 64 * 1024
    const response = await fetch(new URL(`/api/patients/${patientId}/attachments`, app.url), {
      method: 'POST',
      headers: { 'origin': new URL(app.url).origin, 'cookie': howard.cookieHeader(), 'content-type': 'multipart/form-data; boundary=x', 'content-length': String(limit + 1) },
      body: Buffer.alloc(limit + 1),
    }).catch(() => null)
    expect(response?.status).toBe(413)
    const json = await fetch(new URL(url(), app.url), {
      method: 'POST',
      headers: { 'origin': new URL(app.url).origin, 'cookie': howard.cookieHeader(), 'content-type': 'multipart/form-data; boundary=x' },
      body: 'x',
    })
    expect(json.status).toBe(415)
  })

  it('staff file an outside PSA report into the record as a lab result with the PDF attached', async () => {
    const bytes = await pdfBytes()
    const stored = await upload(howard, bytes, 'psa-from-elsewhere.pdf')
    await send(howard, { subject: 'PSA', body: 'My PSA from the other lab', attachmentIds: [stored.body.id] })
    const today = (await nurse.get(`/api/patients/${patientId}/labs`)).body.today as string
    const path = `/api/attachments/${stored.body.id}/file`
    const body = { as: 'lab-result', kind: 'psa', takenOn: today, value: 3.4, note: 'Outside lab report' }
    expect((await howard.post(path, body)).status).toBe(403)
    expect((await otherPatient.post(path, body)).status).toBe(404)
    const filed = await nurse.post(path, body)
    expect(filed.status).toBe(201)
    expect(filed.body.labResult).toMatchObject({ kind: 'psa', value: 3.4, unit: 'ng/mL', takenOn: today })
    expect((await clinician.post(path, body)).status).toBe(409)
    const labs = (await howard.get(`/api/patients/${patientId}/labs`)).body.results as { id: number }[]
    expect(labs.map(r => r.id)).toContain(filed.body.labResult.id)
    const thread = (await nurse.get(url())).body.threads.find((t: { subject: string }) => t.subject === 'PSA')
    expect(thread.messages[0].attachments[0]).toMatchObject({ id: stored.body.id, labResultId: filed.body.labResult.id })
  })
})

describe('closing a message item', () => {
  /** A new thread from him: its id and the queue item it opened (the newest for him). */
  const item = async (subject: string) => {
    const sent = await send(howard, { subject, body: `About ${subject}` })
    expect(sent.status).toBe(201)
    return { threadId: sent.body.threadId as number, itemId: Math.max(...(await messageItems()).map(i => i.id)) }
  }
  const close = (itemId: number) => nurse.post(`/api/triage/${itemId}/events`, { type: 'close' })

  it('needs an answer or an outcome: refused at the field until the nurse answers, then closes with the answer on its timeline', async () => {
    const { threadId, itemId } = await item('Close with an answer')
    expect((await nurse.get(`/api/triage/${itemId}`)).body.answered).toBe(false)
    const refused = await close(itemId)
    expect(refused.status).toBe(400)
    expect(refused.body.message).toBe('errors.answerOrDispositionRequired')
    expect(refused.body.data.fieldErrors.disposition).toEqual(['validation.triage.dispositionOrAnswer'])
    const answer = await send(nurse, { threadId, body: 'Thank you, we have read it and will call you tomorrow morning.' })
    expect(answer.status).toBe(201)
    expect((await nurse.get(`/api/triage/${itemId}`)).body.answered).toBe(true)
    expect((await close(itemId)).status).toBe(200)
    const closed = (await nurse.get(`/api/triage/${itemId}`)).body
    expect(closed).toMatchObject({ status: 'closed', disposition: null })
    expect(closed.events.find((e: { type: string }) => e.type === 'closed').data).toEqual({ answeredBy: answer.body.id })
    // A new message in the thread after that opens a new item: the closed one stays closed.
    expect((await send(howard, { threadId, body: 'One more question' })).status).toBe(201)
    expect(Math.max(...(await messageItems()).map(i => i.id))).toBeGreaterThan(itemId)
  })

  it('an answer entered in error does not count: the item stays open until a standing answer or an outcome', async () => {
    const { threadId, itemId } = await item('Answer in error')
    const wrong = await send(nurse, { threadId, body: 'Meant for another patient' })
    expect((await nurse.post(`/api/messages/${wrong.body.id}/entered-in-error`, { reason: 'Wrong patient' })).status).toBe(200)
    expect((await nurse.get(`/api/triage/${itemId}`)).body.answered).toBe(false)
    expect((await close(itemId)).status).toBe(400)
    expect((await nurse.post(`/api/triage/${itemId}/events`, { type: 'disposition', disposition: 'no-action' })).status).toBe(200)
    expect((await close(itemId)).status).toBe(200)
  })

  it('an item of another kind still needs an outcome: an answer in a thread does not close it', async () => {
    const queue = (await nurse.get('/api/triage?pageSize=100&status=open')).body.items as { id: number, source: string, disposition: string | null, status: string }[]
    const other = queue.find(i => i.source !== 'message' && !i.disposition && i.status !== 'closed')!
    expect(other).toBeDefined()
    const refused = await close(other.id)
    expect(refused.status).toBe(400)
    expect(refused.body.message).toBe('errors.dispositionRequired')
  })
})

describe('uploads never sent', () => {
  it('are removed, file and row, a day after they were made; a sent one and a fresh one stay', async () => {
    const pendingBytes = await pdfBytes(3)
    const pending = (await upload(howard, pendingBytes, 'never-sent.pdf')).body as { id: number }
    const sentUpload = (await upload(howard, await pdfBytes(4), 'sent.pdf')).body as { id: number }
    expect((await send(howard, { subject: 'Kept', body: 'This one is sent', attachmentIds: [sentUpload.id] })).status).toBe(201)
    const objects = () => {
      const files = (dir: string): string[] => readdirSync(dir).flatMap(name => statSync(join(dir, name)).isDirectory() ? files(join(dir, name)) : [join(dir, name)])
      return files(join(app.dataDir, 'objects')).map(file => readFileSync(file))
    }
    expect(objects().some(bytes => bytes.equals(pendingBytes))).toBe(true)
    const prune = async (hoursAhead: number) => (await admin.post('/api/admin/tasks/attachments:prune', { now: new Date(Date.now() + hoursAhead * 3600_000).toISOString() })).body.result.removed as number
    // 23 hours on: not yet a day old, so it stays (other tests' pending uploads too).
    expect(await prune(23)).toBe(0)
    expect((await download(howard, pending.id)).status).toBe(200)
    // 25 hours on: gone from the app and from the object store; the sent file stays.
    expect(await prune(25)).toBeGreaterThanOrEqual(1)
    expect((await download(howard, pending.id)).status).toBe(404)
    expect(objects().some(bytes => bytes.equals(pendingBytes))).toBe(false)
    expect((await download(howard, sentUpload.id)).status).toBe(200)
    // Too late to send it now: the message is refused at the field, nothing stored.
    const late = await send(howard, { subject: 'Late', body: 'x', attachmentIds: [pending.id] })
    expect(late.status).toBe(400)
    expect(late.body.data.fieldErrors.attachmentIds).toEqual(['validation.messages.attachment'])
    expect(await prune(25)).toBe(0)
  })
})
