import ical from 'node-ical'
import type { VEvent } from 'node-ical'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import en from '../../locales/en.json'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'

const CLINIC_ZONE = 'America/Chicago'

let app: RunningApp
let nurse: Client
const ids: Record<string, number> = {}

beforeAll(async () => {
  app = await startApp()
  nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
  for (const p of (await nurse.get('/api/patients')).body as { id: number, clinicNumber: string }[]) ids[p.clinicNumber] = p.id
})
afterAll(() => app?.stop())

/** Calendar-date arithmetic written here on its own, so the checks do not reuse the code under test. */
const plusDays = (date: string, days: number) => new Date(Date.parse(`${date}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10)
const wallClock = (instant: Date) => new Intl.DateTimeFormat('en-GB', { timeZone: CLINIC_ZONE, hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(instant)
const localDay = (instant: Date) => new Intl.DateTimeFormat('en-CA', { timeZone: CLINIC_ZONE }).format(instant)

describe('reading the schedule', () => {
  it('a patient sees his next due date (last injection + 84 days for the 3-month depot), the window and his appointment', async () => {
    const elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const { status, body } = await elias.get(`/api/patients/${ids['LPU-1001']}/schedule`)
    expect(status).toBe(200)
    // Interval: US prescribing information of the 3-month depot, section 2 (every 12 weeks = 84 days).
    expect(body.regimen).toMatchObject({ name: '3-month depot', intervalDays: 84 })
    expect(body.dueDate).toBe(plusDays(body.lastInjection.date, 84))
    // Window: clinic setting, default 7 days either side (from memory of common practice; no published source).
    expect(body.windowOpens).toBe(plusDays(body.dueDate, -7))
    expect(body.windowCloses).toBe(plusDays(body.dueDate, 7))
    expect(body.state).toBe('window-open')
    expect(body.today).toBe(localDay(new Date()))
    expect(body.suggestedSite).toMatch(/^(gluteal|thigh|deltoid)-(left|right)$/)
    expect(body.suggestedSite.split('-')[1]).not.toBe(body.lastInjection.site.split('-')[1])
    expect(body.nextAppointment).toMatchObject({ status: 'booked', durationMinutes: 30 })
    expect(body.can).toEqual({ respond: true, schedule: false, record: false })
    expect(JSON.stringify(body)).not.toMatch(/created_by|createdByUserId|password/i)
  })

  it('another patient\'s schedule, injections and calendar file answer 404', async () => {
    const elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const bernard = ids['LPU-1002']
    expect((await elias.get(`/api/patients/${bernard}/schedule`)).status).toBe(404)
    expect((await elias.get(`/api/patients/${bernard}/injections`)).status).toBe(404)
    expect((await elias.get('/api/patients/999999/schedule')).status).toBe(404)
    const bernardsAppointment = (await nurse.get(`/api/patients/${bernard}/schedule`)).body.nextAppointment.id
    expect((await elias.get(`/api/appointments/${bernardsAppointment}/calendar.ics`)).status).toBe(404)
    expect((await elias.post(`/api/appointments/${bernardsAppointment}/confirm`)).status).toBe(404)
  })

  it('the flare watch runs 28 days from the first injection (clinic default; prescribing information, Warnings)', async () => {
    const { body } = await nurse.get(`/api/patients/${ids['LPU-1005']}/schedule`)
    expect(body.flareWatch).toEqual({ active: true, startsOn: body.lastInjection.date, endsOn: plusDays(body.lastInjection.date, 27) })
    const notStarted = (await nurse.get(`/api/patients/${ids['LPU-1006']}/schedule`)).body
    expect(notStarted).toMatchObject({ state: 'not-started', dueDate: null, lastInjection: null, flareWatch: { active: false } })
  })
})

describe('confirming an appointment', () => {
  it('a caregiver whose grant is view-only cannot confirm (403), and nothing changes', async () => {
    const bernard = ids['LPU-1002']
    const dana = await Client.signIn(app.url, 'dana@demo.tidewell.test')
    const seen = (await dana.get(`/api/patients/${bernard}/schedule`)).body
    expect(seen.can.respond).toBe(false)
    const reply = await dana.post(`/api/appointments/${seen.nextAppointment.id}/confirm`)
    expect(reply.status).toBe(403)
    const change = await dana.post(`/api/appointments/${seen.nextAppointment.id}/change-request`, { firstChoice: plusDays(seen.today, 3) })
    expect(change.status).toBe(403)
    expect((await nurse.get(`/api/patients/${bernard}/schedule`)).body.nextAppointment).toMatchObject({ status: 'booked', confirmedAt: null, openRequest: null })
  })

  it('a caregiver with no grant for that patient gets 404', async () => {
    const marisol = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    const appointment = (await nurse.get(`/api/patients/${ids['LPU-1002']}/schedule`)).body.nextAppointment.id
    expect((await marisol.post(`/api/appointments/${appointment}/confirm`)).status).toBe(404)
  })

  it('the caregiver allowed to manage appointments confirms, and the confirmation shows who did it', async () => {
    const marisol = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    const schedule = (await marisol.get(`/api/patients/${ids['LPU-1001']}/schedule`)).body
    expect(schedule.can.respond).toBe(true)
    const reply = await marisol.post(`/api/appointments/${schedule.nextAppointment.id}/confirm`)
    expect(reply.status).toBe(200)
    expect(reply.body).toMatchObject({ status: 'confirmed', confirmedBy: { name: 'Marisol Marwood', relation: 'caregiver', role: 'caregiver' } })
    const again = await marisol.post(`/api/appointments/${schedule.nextAppointment.id}/confirm`)
    expect(again.body.confirmedAt).toBe(reply.body.confirmedAt)
    const elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    expect((await elias.get(`/api/patients/${ids['LPU-1001']}/schedule`)).body.nextAppointment.status).toBe('confirmed')
  })
})

describe('recording an injection', () => {
  const howard = () => ids['LPU-1011']

  it('a date in the future is refused at the date field with a clear message, and nothing is stored', async () => {
    const before = (await nurse.get(`/api/patients/${howard()}/schedule`)).body
    const history = (await nurse.get(`/api/patients/${howard()}/injections`)).body as unknown[]
    const reply = await nurse.post(`/api/patients/${howard()}/injections`, {
      date: plusDays(before.today, 1), time: '09:00', site: before.suggestedSite, lotNumber: 'LQ9001K', lotExpiresOn: plusDays(before.today, 300), regimenId: before.regimen.id,
    })
    expect(reply.status).toBe(400)
    expect(reply.body.data.fieldErrors).toEqual({ date: ['validation.schedule.futureDate'] })
    expect(en.validation.schedule.futureDate).toBe('The injection date cannot be in the future.')
    expect((await nurse.get(`/api/patients/${howard()}/injections`)).body).toHaveLength(history.length)
    expect((await nurse.get(`/api/patients/${howard()}/schedule`)).body).toMatchObject({ state: 'overdue', dueDate: before.dueDate })
  })

  it('patients, caregivers and admins cannot record one', async () => {
    const body = { date: '2026-01-05', time: '09:00', site: 'gluteal-left', lotNumber: 'LQ1', lotExpiresOn: '2027-01-01', regimenId: 1 }
    const elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    expect((await elias.post(`/api/patients/${ids['LPU-1001']}/injections`, body)).status).toBe(403)
    const marisol = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    expect((await marisol.post(`/api/patients/${ids['LPU-1001']}/injections`, body)).status).toBe(403)
    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    expect((await admin.post(`/api/patients/${ids['LPU-1001']}/injections`, body)).status).toBe(403)
  })

  it('a nurse records one today: the next due date moves 84 days on and the patient leaves the overdue group', async () => {
    const before = (await nurse.get(`/api/patients/${howard()}/schedule`)).body
    const dueBefore = (await nurse.get('/api/due-list')).body
    expect(dueBefore.rows.find((r: { patientId: number }) => r.patientId === howard())).toMatchObject({ group: 'overdue', state: 'overdue' })
    const reply = await nurse.post(`/api/patients/${howard()}/injections`, {
      date: before.today, time: '00:05', site: before.suggestedSite, lotNumber: 'lq9002m', lotExpiresOn: plusDays(before.today, 200), regimenId: before.regimen.id, note: 'No reaction.',
    })
    expect(reply.status).toBe(201)
    expect(reply.body).toMatchObject({ givenOn: before.today, site: before.suggestedSite, lotNumber: 'LQ9002M', givenBy: 'Nora Lindqvist', note: 'No reaction.' })
    const after = (await nurse.get(`/api/patients/${howard()}/schedule`)).body
    expect(after).toMatchObject({ state: 'upcoming', dueDate: plusDays(before.today, 84), daysToDue: 84 })
    expect(after.suggestedSite.split('-')[1]).not.toBe(before.suggestedSite.split('-')[1])
    const dueAfter = (await nurse.get('/api/due-list')).body
    expect(dueAfter.rows.find((r: { patientId: number }) => r.patientId === howard())).toBeUndefined()
    expect(dueAfter.later).toBe(dueBefore.later + 1)

    const twice = await nurse.post(`/api/patients/${howard()}/injections`, {
      date: before.today, time: '00:06', site: after.suggestedSite, lotNumber: 'LQ9003', lotExpiresOn: plusDays(before.today, 200), regimenId: before.regimen.id,
    })
    expect(twice.status).toBe(400)
    expect(twice.body.data.fieldErrors).toEqual({ date: ['validation.schedule.alreadyRecorded'] })
  })
})

describe('booking, asking for another time and the calendar file', () => {
  const cyril = () => ids['LPU-1008']

  it('offers free weekday slots inside the window', async () => {
    const schedule = (await nurse.get(`/api/patients/${cyril()}/schedule`)).body
    const { body } = await nurse.get(`/api/patients/${cyril()}/slots`)
    expect(body.slots.length).toBeGreaterThan(0)
    for (const slot of body.slots) {
      expect(slot.date >= schedule.windowOpens && slot.date <= schedule.windowCloses).toBe(true)
      expect([0, 6]).not.toContain(new Date(`${slot.date}T12:00:00Z`).getUTCDay())
      expect(wallClock(new Date(slot.startsAt))).toBe(slot.time)
    }
  })

  it('staff book, the patient asks for another time, staff move it, and the calendar file follows', async () => {
    const schedule = (await nurse.get(`/api/patients/${cyril()}/schedule`)).body
    const booked = await nurse.post(`/api/patients/${cyril()}/appointments`, { date: schedule.dueDate, time: '10:30', place: 'Injection room 2', durationMinutes: 30 })
    expect(booked.status).toBe(201)
    expect(booked.body).toMatchObject({ status: 'booked', localDate: schedule.dueDate, localTime: '10:30' })

    const patient = await Client.signIn(app.url, 'cyril@demo.tidewell.test')
    const past = await patient.post(`/api/appointments/${booked.body.id}/change-request`, { firstChoice: schedule.today })
    expect(past.status).toBe(400)
    expect(past.body.data.fieldErrors).toEqual({ firstChoice: ['validation.schedule.choiceNotFuture'] })
    const wanted = [plusDays(schedule.dueDate, 1), plusDays(schedule.dueDate, 2)]
    const asked = await patient.post(`/api/appointments/${booked.body.id}/change-request`, { firstChoice: wanted[0], secondChoice: wanted[1], note: 'Mornings, please.' })
    expect(asked.status).toBe(201)
    expect(asked.body).toMatchObject({ status: 'change-requested', openRequest: { preferredDates: wanted, note: 'Mornings, please.', requestedBy: { name: 'Cyril Hathersage', relation: 'self' } } })

    const staffView = (await nurse.get(`/api/patients/${cyril()}/schedule`)).body
    const requestId = staffView.nextAppointment.openRequest.id
    // The clinic-wide list: the demo's request from Mateo (seeded first), then Cyril's.
    const open = (await nurse.get('/api/change-requests')).body.rows as { id: number, patient: { clinicNumber: string }, preferredDates: string[] }[]
    expect(open.map(r => r.patient.clinicNumber)).toEqual(['LPU-1012', 'LPU-1008'])
    expect(open[1]).toMatchObject({ id: requestId, preferredDates: wanted, appointment: { id: booked.body.id } })
    expect((await patient.get('/api/change-requests')).status).toBe(403)
    const answered = await nurse.post(`/api/change-requests/${requestId}/answer`, { decision: 'move', date: wanted[1], time: '09:15', note: 'Moved to the morning.' })
    expect(answered.status).toBe(200)
    expect(answered.body).toMatchObject({ status: 'booked', localDate: wanted[1], localTime: '09:15', openRequest: null, lastAnswer: { decision: 'move', note: 'Moved to the morning.', answeredBy: 'Nora Lindqvist' } })
    expect((await nurse.post(`/api/change-requests/${requestId}/answer`, { decision: 'keep' })).status).toBe(409)
    expect(((await nurse.get('/api/change-requests')).body.rows as { id: number }[]).map(r => r.id)).not.toContain(requestId)

    const seen = (await patient.get(`/api/patients/${cyril()}/schedule`)).body.nextAppointment
    expect(seen).toMatchObject({ id: booked.body.id, localDate: wanted[1], lastAnswer: { decision: 'move' } })

    // RFC 5545 file, read back with node-ical (a general-purpose iCalendar parser).
    const file = await patient.get(`/api/appointments/${booked.body.id}/calendar.ics`)
    expect(file.status).toBe(200)
    expect(file.headers.get('content-type')).toMatch(/^text\/calendar/)
    const events = Object.values(ical.sync.parseICS(file.body as string)).filter((c): c is VEvent => c?.type === 'VEVENT')
    expect(events).toHaveLength(1)
    const event = events[0]!
    expect(event.summary).toBe('Injection appointment at Larkspur Point Urology')
    expect(event.location).toBe('Injection room 2')
    expect(event.start.toISOString()).toBe(seen.startsAt)
    expect(event.end!.getTime() - event.start.getTime()).toBe(30 * 60_000)
    // Written in UTC; in the clinic's zone it is the booked 09:15 on the chosen day.
    expect((event.start as Date & { tz?: string }).tz).toBe('Etc/UTC')
    expect(wallClock(event.start)).toBe('09:15')
    expect(localDay(event.start)).toBe(wanted[1])
    expect(Number(event.sequence)).toBe(1)
  })

  it('a caregiver\'s calendar file is in his language, and a closed appointment cannot be confirmed', async () => {
    const elias = ids['LPU-1001']
    const appointment = (await nurse.get(`/api/patients/${elias}/schedule`)).body.nextAppointment
    const marisol = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    expect((await marisol.patch('/api/me/language', { language: 'es' })).status).toBe(200)
    const file = await marisol.get(`/api/appointments/${appointment.id}/calendar.ics`)
    const event = Object.values(ical.sync.parseICS(file.body as string)).find((c): c is VEvent => c?.type === 'VEVENT')!
    expect(event.summary).toBe('Cita para la inyección en Larkspur Point Urology')

    const rebooked = await nurse.post(`/api/patients/${elias}/appointments`, { date: appointment.localDate, time: '15:30', place: 'Injection room 1' })
    expect(rebooked.status).toBe(201)
    const stale = await marisol.post(`/api/appointments/${appointment.id}/confirm`)
    expect(stale.status).toBe(409)
    expect(stale.body.message).toBe('errors.schedule.appointmentClosed')
  })
})

describe('regimens', () => {
  it('lists the four common intervals and lets a clinician add the clinic\'s own once', async () => {
    const list = (await nurse.get('/api/regimens')).body as { name: string, intervalDays: number }[]
    expect(list.map(r => r.intervalDays)).toEqual([28, 84, 112, 168])
    expect((await nurse.post('/api/regimens', { name: '2-month depot', intervalDays: 56 })).status).toBe(403)
    const clinician = await Client.signIn(app.url, 'clinician@demo.tidewell.test')
    expect((await clinician.post('/api/regimens', { name: '2-month depot', intervalDays: 56 })).status).toBe(201)
    const clash = await clinician.post('/api/regimens', { name: '2-MONTH DEPOT', intervalDays: 60 })
    expect(clash.status).toBe(409)
    expect((await clinician.post('/api/regimens', { name: 'Weekly', intervalDays: 3 })).body.data.fieldErrors).toEqual({ intervalDays: ['validation.schedule.intervalRange'] })
  })
})
