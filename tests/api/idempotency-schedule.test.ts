import { randomUUID } from 'node:crypto'
import ical from 'node-ical'
import type { VEvent } from 'node-ical'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import en from '../../locales/en.json'
import es from '../../locales/es.json'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { patientIds } from '../support/circle'
import type { Reply } from '../support/client'
import { Client } from '../support/client'
import { diaryEntry } from '../support/diary'
import type { CaughtMessage } from '../support/mail-catcher'
import { MailCatcher } from '../support/mail-catcher'
import { sql } from '../support/sqlite'

/*
 * Issue 10: a retry or a double click of an invitation or a request for another time
 * returns the first record (201, then 200 with the same id) and sends one e-mail; two
 * schedule changes at the same moment leave one state, the loser gets 409 and writes no
 * e-mail, and what the patient is e-mailed (text and calendar file) is what is stored.
 * Requests "at the same moment" are sent together with Promise.all; the server may take
 * them in either order, so each check holds for both orders.
 */

const CLINIC_ZONE = 'America/Chicago'

let app: RunningApp
let mail: MailCatcher
let ids: Record<string, number>
let nurse: Client
let nurse2: Client

beforeAll(async () => {
  mail = await MailCatcher.start()
  app = await startApp({ smtpUrl: mail.url })
  ids = await patientIds(app.url)
  nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
  nurse2 = await Client.signIn(app.url, 'nurse2@demo.tidewell.test')
})
afterAll(async () => {
  await app?.stop()
  await mail?.stop()
})

/** Calendar-date arithmetic and the clinic's wall clock, written here so the checks do not reuse the code under test. */
const plusDays = (date: string, days: number) => new Date(Date.parse(`${date}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10)
const wallClock = (instant: Date) => new Intl.DateTimeFormat('en-GB', { timeZone: CLINIC_ZONE, hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(instant)
const localDay = (instant: Date) => new Intl.DateTimeFormat('en-CA', { timeZone: CLINIC_ZONE }).format(instant)

const outboxTo = (address: string, subject: string) => sql<{ id: number }>(app, 'SELECT id FROM outbox_messages WHERE to_address = ? AND subject = ?', [address, subject])
const statuses = (replies: Reply[]) => replies.map(r => r.status).sort()

let flushes = 0
/**
 * Waits until every e-mail written so far has reached the catcher: the outbox sends oldest
 * first, so once an invitation written now arrives, every earlier message has arrived too.
 */
async function flushMail() {
  const franklin = await Client.signIn(app.url, 'franklin@demo.tidewell.test')
  const address = `flush-${++flushes}@demo.tidewell.test`
  const sent = await franklin.post(`/api/patients/${ids['LPU-1005']}/circle`, { name: 'Flush Marker', email: address, canLogDiary: false, canManageAppointments: false })
  expect(sent.status).toBe(201)
  await mail.waitFor(m => m.to.includes(address))
}

const caught = (address: string, subject: string) => mail.messages.filter(m => m.to.includes(address) && m.subject === subject)

function calendarEventOf(message: CaughtMessage): VEvent {
  const file = message.attachments.find(a => a.filename === 'tidewell-appointment.ics')
  expect(file, 'the e-mail carries the calendar file').toBeDefined()
  const events = Object.values(ical.sync.parseICS(file!.content.toString('utf8'))).filter((c): c is VEvent => c?.type === 'VEVENT')
  expect(events).toHaveLength(1)
  return events[0]!
}

describe('invitations with a requestId', () => {
  it('a double click stores one invitation and sends one e-mail: 201, then 200 with the same id', async () => {
    const elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const patientId = ids['LPU-1001']!
    const body = { name: 'Wren Halvorsen', email: 'wren@demo.tidewell.test', language: 'en', canLogDiary: true, canManageAppointments: false, requestId: randomUUID() }
    const together = await Promise.all([1, 2].map(() => elias.post(`/api/patients/${patientId}/circle`, body)))
    expect(statuses(together)).toEqual([200, 201])
    expect(together[0]!.body.id).toBe(together[1]!.body.id)
    const retry = await elias.post(`/api/patients/${patientId}/circle`, body)
    expect(retry.status).toBe(200)
    expect(retry.body).toEqual(together.find(r => r.status === 201)!.body)

    const stored = await sql<{ id: number, status: string }>(app, 'SELECT id, status FROM circle_invitations WHERE email = ?', ['wren@demo.tidewell.test'])
    expect(stored).toEqual([{ id: retry.body.id, status: 'pending' }])
    expect(await outboxTo('wren@demo.tidewell.test', en.mail.circleInvite.subject)).toHaveLength(1)
    await flushMail()
    expect(caught('wren@demo.tidewell.test', en.mail.circleInvite.subject)).toHaveLength(1)
  })

  it('a new form (a new requestId) to the same address is a new invitation that replaces the first; an old client without one still works', async () => {
    const elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const patientId = ids['LPU-1001']!
    const body = { name: 'Wren Halvorsen', email: 'wren@demo.tidewell.test', language: 'en', canLogDiary: false, canManageAppointments: false }
    const again = await elias.post(`/api/patients/${patientId}/circle`, { ...body, requestId: randomUUID() })
    expect(again.status).toBe(201)
    const legacy = await elias.post(`/api/patients/${patientId}/circle`, body)
    expect(legacy.status).toBe(201)
    const stored = await sql<{ id: number, status: string }>(app, 'SELECT id, status FROM circle_invitations WHERE email = ? ORDER BY id', ['wren@demo.tidewell.test'])
    expect(stored.map(s => s.status)).toEqual(['cancelled', 'cancelled', 'pending'])
    expect(stored.at(-1)!.id).toBe(legacy.body.id)
  })

  it('the same requestId from another patient does not reach his invitation', async () => {
    const requestId = randomUUID()
    const elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const first = await elias.post(`/api/patients/${ids['LPU-1001']}/circle`, { name: 'Juno Brask', email: 'juno@demo.tidewell.test', canLogDiary: false, canManageAppointments: false, requestId })
    expect(first.status).toBe(201)
    const bernard = await Client.signIn(app.url, 'bernard@demo.tidewell.test')
    const other = await bernard.post(`/api/patients/${ids['LPU-1002']}/circle`, { name: 'Ivo Renner', email: 'ivo@demo.tidewell.test', canLogDiary: false, canManageAppointments: false, requestId })
    expect(other.status).toBe(201)
    expect(other.body.id).not.toBe(first.body.id)
    expect(other.body.email).toBe('ivo@demo.tidewell.test')
  })

  it('refuses a requestId that is not a uuid, at the field', async () => {
    const elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const reply = await elias.post(`/api/patients/${ids['LPU-1001']}/circle`, { name: 'Juno Brask', email: 'juno2@demo.tidewell.test', canLogDiary: false, canManageAppointments: false, requestId: 'click-1' })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors).toEqual({ requestId: ['validation.generic.requestId'] })
    expect(en.validation.generic.requestId).toMatch(/reload the page/)
  })
})

describe('requests for another time with a requestId', () => {
  it('a double click stores one open request and e-mails each nurse on duty once: 201, then 200 with the same id', async () => {
    const bernard = await Client.signIn(app.url, 'bernard@demo.tidewell.test')
    const patientId = ids['LPU-1002']!
    const schedule = (await bernard.get(`/api/patients/${patientId}/schedule`)).body
    const appointmentId = schedule.nextAppointment.id
    const body = { firstChoice: plusDays(schedule.today, 4), note: 'Afternoons are easier.', requestId: randomUUID() }
    const together = await Promise.all([1, 2].map(() => bernard.post(`/api/appointments/${appointmentId}/change-request`, body)))
    expect(statuses(together)).toEqual([200, 201])
    const requestId = together[0]!.body.changeRequest.id
    expect(together[1]!.body.changeRequest.id).toBe(requestId)
    expect(together[0]!.body).toMatchObject({ status: 'change-requested', openRequest: { id: requestId, note: 'Afternoons are easier.' }, changeRequest: { id: requestId, status: 'open' } })

    const stored = await sql<{ id: number, status: string }>(app, 'SELECT id, status FROM appointment_change_requests WHERE appointment_id = ?', [appointmentId])
    expect(stored).toEqual([{ id: requestId, status: 'open' }])
    const asked = await sql<{ to_address: string }>(app, 'SELECT to_address FROM outbox_messages WHERE dedupe_key LIKE ?', ['change-asked:%'])
    expect(asked.map(a => a.to_address).sort()).toEqual(['nurse2@demo.tidewell.test', 'nurse@demo.tidewell.test'])
    await flushMail()
    for (const address of ['nurse@demo.tidewell.test', 'nurse2@demo.tidewell.test']) {
      expect(caught(address, en.mail.scheduleChangeAsked.subject).filter(m => m.text.includes('LPU-1002'))).toHaveLength(1)
    }

    // Answered in the meantime, the same form sent again still gets its own request back, unchanged.
    expect((await nurse.post(`/api/change-requests/${requestId}/answer`, { decision: 'keep' })).status).toBe(200)
    const late = await bernard.post(`/api/appointments/${appointmentId}/change-request`, body)
    expect(late.status).toBe(200)
    expect(late.body.changeRequest).toEqual({ id: requestId, status: 'answered' })
    expect(late.body.openRequest).toBeNull()
    expect(await sql(app, 'SELECT id FROM appointment_change_requests WHERE appointment_id = ?', [appointmentId])).toHaveLength(1)
  })

  it('two different requests at once leave one open request, the later one', async () => {
    const bernard = await Client.signIn(app.url, 'bernard@demo.tidewell.test')
    const patientId = ids['LPU-1002']!
    const schedule = (await bernard.get(`/api/patients/${patientId}/schedule`)).body
    const appointmentId = schedule.nextAppointment.id
    const replies = await Promise.all([5, 6].map(days => bernard.post(`/api/appointments/${appointmentId}/change-request`, { firstChoice: plusDays(schedule.today, days), requestId: randomUUID() })))
    expect(statuses(replies)).toEqual([201, 201])
    const open = await sql<{ id: number }>(app, 'SELECT id FROM appointment_change_requests WHERE appointment_id = ? AND status = \'open\'', [appointmentId])
    expect(open).toHaveLength(1)
    expect(open[0]!.id).toBe(Math.max(...replies.map(r => r.body.changeRequest.id)))
  })
})

describe('two nurses answer one request at the same moment', () => {
  it('one gets 200 and the other 409 with nothing written, and the patient\'s e-mail and calendar file say what the record says', async () => {
    const patientId = ids['LPU-1012']!
    const schedule = (await nurse.get(`/api/patients/${patientId}/schedule`)).body
    const request = schedule.nextAppointment.openRequest
    expect(request).not.toBeNull()
    const day = plusDays(schedule.today, 3)
    const answers = [
      { by: nurse, body: { decision: 'move', date: day, time: '10:00', place: 'Injection room 1', note: 'Morning slot.' } },
      { by: nurse2, body: { decision: 'move', date: day, time: '11:00', place: 'Injection room 2', note: 'Late morning.' } },
    ]
    const replies = await Promise.all(answers.map(a => a.by.post(`/api/change-requests/${request.id}/answer`, a.body)))
    expect(statuses(replies)).toEqual([200, 409])
    const loser = replies.find(r => r.status === 409)!
    expect(loser.body.message).toBe('errors.schedule.requestClosed')
    expect(en.errors.schedule.requestClosed).toBe('This request was already answered or withdrawn.')
    const winner = answers[replies.findIndex(r => r.status === 200)]!.body

    const record = (await nurse.get(`/api/patients/${patientId}/schedule`)).body.nextAppointment
    expect(record).toMatchObject({ id: schedule.nextAppointment.id, localDate: day, localTime: winner.time, place: winner.place, status: 'booked', lastAnswer: { note: winner.note } })
    const rows = await sql<{ status: string, answer_note: string }>(app, 'SELECT status, answer_note FROM appointment_change_requests WHERE id = ?', [request.id])
    expect(rows).toEqual([{ status: 'answered', answer_note: winner.note }])
    // The calendar SEQUENCE counts moves: moved once, not twice.
    const sequence = await sql<{ sequence: number }>(app, 'SELECT sequence FROM appointments WHERE id = ?', [record.id])
    expect(sequence).toEqual([{ sequence: 1 }])

    // Mateo reads Spanish (demo clinic); one e-mail, and it says the stored time and room.
    const address = 'mateo@demo.tidewell.test'
    expect(await outboxTo(address, es.mail.scheduleChangeMoved.subject)).toHaveLength(1)
    await flushMail()
    const messages = caught(address, es.mail.scheduleChangeMoved.subject)
    expect(messages).toHaveLength(1)
    expect(messages[0]!.text).toContain(winner.place)
    const loserPlace = answers.find(a => a.body !== winner)!.body.place
    expect(messages[0]!.text).not.toContain(loserPlace)
    const event = calendarEventOf(messages[0]!)
    expect(event.start.toISOString()).toBe(record.startsAt)
    expect(wallClock(event.start)).toBe(winner.time)
    expect(localDay(event.start)).toBe(day)
    expect(event.location).toBe(record.place)
    expect(Number(event.sequence)).toBe(1)
  })
})

describe('the same nurse sends her answer twice', () => {
  it('the second send gets 200 with the same appointment and no second e-mail; a different answer after it gets 409', async () => {
    const patientId = ids['LPU-1002']!
    const bernard = await Client.signIn(app.url, 'bernard@demo.tidewell.test')
    const schedule = (await bernard.get(`/api/patients/${patientId}/schedule`)).body
    const requestId = schedule.nextAppointment.openRequest.id
    const answer = { decision: 'move', date: plusDays(schedule.today, 6), time: '13:15', place: 'Injection room 4', note: 'After lunch.' }
    const first = await nurse.post(`/api/change-requests/${requestId}/answer`, answer)
    expect(first.status).toBe(200)
    const again = await nurse.post(`/api/change-requests/${requestId}/answer`, answer)
    expect(again.status).toBe(200)
    expect(again.body).toEqual(first.body)
    const other = await nurse.post(`/api/change-requests/${requestId}/answer`, { ...answer, time: '15:00' })
    expect(other.status).toBe(409)
    expect((await nurse2.post(`/api/change-requests/${requestId}/answer`, answer)).status).toBe(409)
    expect(await outboxTo('bernard@demo.tidewell.test', en.mail.scheduleChangeMoved.subject)).toHaveLength(1)
    const stored = (await nurse.get(`/api/patients/${patientId}/schedule`)).body.nextAppointment
    expect(stored).toMatchObject({ localTime: '13:15', place: 'Injection room 4' })
  })
})

describe('two confirmations at the same moment', () => {
  it('both answer 200 (or one 409) and one confirmation is stored', async () => {
    const patientId = ids['LPU-1001']!
    const elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const marisol = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    const appointment = (await elias.get(`/api/patients/${patientId}/schedule`)).body.nextAppointment
    expect(appointment.status).toBe('booked')
    const replies = await Promise.all([elias, marisol].map(who => who.post(`/api/appointments/${appointment.id}/confirm`)))
    for (const reply of replies) expect([200, 409]).toContain(reply.status)
    const ok = replies.filter(r => r.status === 200)
    expect(ok.length).toBeGreaterThan(0)
    const stored = (await nurse.get(`/api/patients/${patientId}/schedule`)).body.nextAppointment
    expect(stored.status).toBe('confirmed')
    for (const reply of ok) {
      expect(reply.body.confirmedAt).toBe(stored.confirmedAt)
      expect(reply.body.confirmedBy).toEqual(stored.confirmedBy)
    }
  })

  it('a confirmation and a request for another time at once: one of them holds, the other sees it', async () => {
    const patientId = ids['LPU-1005']!
    const franklin = await Client.signIn(app.url, 'franklin@demo.tidewell.test')
    const schedule = (await franklin.get(`/api/patients/${patientId}/schedule`)).body
    const appointmentId = schedule.nextAppointment.id
    const [confirmed, asked] = await Promise.all([
      franklin.post(`/api/appointments/${appointmentId}/confirm`),
      franklin.post(`/api/appointments/${appointmentId}/change-request`, { firstChoice: plusDays(schedule.today, 8), requestId: randomUUID() }),
    ])
    expect(confirmed!.status).toBe(200)
    expect(asked!.status).toBe(201)
    const stored = (await nurse.get(`/api/patients/${patientId}/schedule`)).body.nextAppointment
    const open = await sql<{ id: number }>(app, 'SELECT id FROM appointment_change_requests WHERE appointment_id = ? AND status = \'open\'', [appointmentId])
    // Either the request came last (it stands, the appointment waits for an answer) or the
    // confirmation did (it withdrew the request): never a confirmed appointment with an open request.
    if (stored.status === 'confirmed') expect(open).toHaveLength(0)
    else expect({ status: stored.status, open: open.length, confirmedAt: stored.confirmedAt }).toEqual({ status: 'change-requested', open: 1, confirmedAt: null })
  })
})

describe('rebooking while a nurse answers the request', () => {
  it('the new booking stands; the answer either came first or gets 409; the patient\'s last e-mail is the stored appointment', async () => {
    const patientId = ids['LPU-1007']!
    const ramon = await Client.signIn(app.url, 'ramon@demo.tidewell.test')
    const schedule = (await ramon.get(`/api/patients/${patientId}/schedule`)).body
    const oldId = schedule.nextAppointment.id
    const asked = await ramon.post(`/api/appointments/${oldId}/change-request`, { firstChoice: plusDays(schedule.today, 2), requestId: randomUUID() })
    expect(asked.status).toBe(201)
    const requestId = asked.body.changeRequest.id
    // The answer moves it earlier than the new booking, so a cancelled appointment brought back would show as his next one.
    const moveTo = plusDays(schedule.today, 2)
    const bookOn = plusDays(schedule.today, 9)
    const [answer, booking] = await Promise.all([
      nurse.post(`/api/change-requests/${requestId}/answer`, { decision: 'move', date: moveTo, time: '08:30', place: 'Injection room 1' }),
      nurse2.post(`/api/patients/${patientId}/appointments`, { date: bookOn, time: '15:00', place: 'Injection room 3' }),
    ])
    expect(booking!.status).toBe(201)
    expect([200, 409]).toContain(answer!.status)
    if (answer!.status === 409) expect(answer!.body.message).toBe('errors.schedule.requestClosed')

    const next = (await ramon.get(`/api/patients/${patientId}/schedule`)).body.nextAppointment
    expect(next).toMatchObject({ id: booking!.body.id, localDate: bookOn, localTime: '15:00', place: 'Injection room 3', status: 'booked', openRequest: null })
    const open = await sql<{ id: number, status: string }>(app, 'SELECT id, status FROM appointments WHERE patient_id = ? AND status IN (\'booked\', \'confirmed\', \'change-requested\')', [patientId])
    expect(open).toEqual([{ id: booking!.body.id, status: 'booked' }])
    const request = await sql<{ status: string }>(app, 'SELECT status FROM appointment_change_requests WHERE id = ?', [requestId])
    expect(request).toEqual([{ status: answer!.status === 200 ? 'answered' : 'withdrawn' }])

    // Ramón reads Spanish. A "new time" e-mail only when the answer won; the booking e-mail always, last, with the stored appointment.
    const address = 'ramon@demo.tidewell.test'
    await flushMail()
    expect(caught(address, es.mail.scheduleChangeMoved.subject)).toHaveLength(answer!.status === 200 ? 1 : 0)
    const booked = caught(address, es.mail.appointmentBooked.subject)
    expect(booked).toHaveLength(1)
    const ours = mail.messages.filter(m => m.to.includes(address))
    expect(ours.at(-1)).toBe(booked[0])
    const event = calendarEventOf(booked[0]!)
    expect(event.start.toISOString()).toBe(next.startsAt)
    expect(event.location).toBe('Injection room 3')
  })
})

describe('two nurses book at the same moment', () => {
  it('with the appointment each saw (replaces), one booking wins and the other gets 409: one new appointment, one e-mail', async () => {
    const patientId = ids['LPU-1006']!
    const schedule = (await nurse.get(`/api/patients/${patientId}/schedule`)).body
    const seen = schedule.nextAppointment.id
    const bookings = [
      { by: nurse, body: { date: plusDays(schedule.today, 10), time: '09:00', place: 'Injection room 1', replaces: seen } },
      { by: nurse2, body: { date: plusDays(schedule.today, 11), time: '14:00', place: 'Injection room 2', replaces: seen } },
    ]
    const replies = await Promise.all(bookings.map(b => b.by.post(`/api/patients/${patientId}/appointments`, b.body)))
    expect(statuses(replies)).toEqual([201, 409])
    expect(replies.find(r => r.status === 409)!.body.message).toBe('errors.schedule.appointmentChanged')
    expect(en.errors.schedule.appointmentChanged).toMatch(/changed this appointment/)
    const winner = bookings[replies.findIndex(r => r.status === 201)]!.body
    const open = await sql<{ place: string }>(app, 'SELECT place FROM appointments WHERE patient_id = ? AND status IN (\'booked\', \'confirmed\', \'change-requested\')', [patientId])
    expect(open).toEqual([{ place: winner.place }])
    const address = 'kenji@demo.tidewell.test'
    await flushMail()
    const booked = caught(address, en.mail.appointmentBooked.subject)
    expect(booked).toHaveLength(1)
    expect(calendarEventOf(booked[0]!).location).toBe(winner.place)

    // A page that saw no appointment (null) while one is open is refused the same way.
    const stale = await nurse.post(`/api/patients/${patientId}/appointments`, { date: plusDays(schedule.today, 12), time: '09:00', place: 'Injection room 1', replaces: null })
    expect(stale.status).toBe(409)
  })
})

describe('the diary and the right-now send stay idempotent', () => {
  it('three sends of one draft at the same moment store one entry: one 201, then 200 with the same id', async () => {
    const patientId = ids['LPU-1009']!
    const desmond = await Client.signIn(app.url, 'desmond@demo.tidewell.test')
    const draftId = randomUUID()
    const before = await sql(app, 'SELECT id FROM diary_entries WHERE patient_id = ?', [patientId])
    const right = await Promise.all([1, 2].map(() => desmond.post(`/api/patients/${patientId}/diary/right-now`, { draftId, items: ['chestPain'] })))
    expect(statuses(right)).toEqual([200, 201])
    const body = { ...diaryEntry({ pain: { worst: 2, locations: ['back'] } }), draftId }
    const replies = await Promise.all([1, 2, 3].map(() => desmond.post(`/api/patients/${patientId}/diary`, body)))
    expect(statuses(replies)).toEqual([200, 200, 200])
    expect(new Set([...right, ...replies].map(r => r.body.id)).size).toBe(1)
    const after = await sql(app, 'SELECT id FROM diary_entries WHERE patient_id = ?', [patientId])
    expect(after.length - before.length).toBe(1)
    expect(await sql(app, 'SELECT id FROM triage_items WHERE diary_entry_id = ?', [right[0]!.body.id])).toHaveLength(1)
  })
})
