import { DateTime } from 'luxon'
import ical from 'node-ical'
import type { VEvent } from 'node-ical'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import type { CaughtMessage } from '../support/mail-catcher'
import { MailCatcher } from '../support/mail-catcher'

const CLINIC_ZONE = 'America/Chicago'

let app: RunningApp
let mail: MailCatcher
let admin: Client
let nurse: Client
const ids: Record<string, number> = {}

beforeAll(async () => {
  mail = await MailCatcher.start()
  app = await startApp({ smtpUrl: mail.url })
  admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
  nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
  for (const p of (await nurse.get('/api/patients')).body as { id: number, clinicNumber: string }[]) ids[p.clinicNumber] = p.id
})
afterAll(async () => {
  await app?.stop()
  await mail?.stop()
})

/** 08:00 in the clinic, `days` calendar days from a clinic date, as the task's "now". */
const morningOf = (date: string, days: number) => DateTime.fromISO(`${date}T08:00`, { zone: CLINIC_ZONE }).plus({ days }).toUTC().toISO()!
const runReminders = async (now: string) => {
  const reply = await admin.post('/api/admin/tasks/schedule:reminders', { now })
  expect(reply.status).toBe(200)
  return reply.body.result as { reminders: number, pleaseBook: number }
}
const settle = () => new Promise(r => setTimeout(r, 1500))
const calendarIn = (message: CaughtMessage) => {
  const attachment = message.attachments.find(a => a.filename?.endsWith('.ics'))
  expect(attachment?.contentType).toBe('text/calendar')
  return Object.values(ical.sync.parseICS(attachment!.content.toString('utf8'))).find((c): c is VEvent => c?.type === 'VEVENT')!
}

// Runs first: later tests move the task's clock weeks ahead, past his appointment.
describe('with an appointment booked', () => {
  it('a patient gets no "please book" e-mail, while an overdue one without an appointment does, in Spanish', async () => {
    const schedule = (await nurse.get(`/api/patients/${ids['LPU-1002']}/schedule`)).body
    expect(schedule.nextAppointment).not.toBeNull()
    const run = await runReminders(morningOf(schedule.today, 0))
    expect(run.pleaseBook).toBeGreaterThanOrEqual(1)
    const luis = await mail.waitFor(m => m.to.includes('luis@demo.tidewell.test'))
    expect(luis.subject).toBe('Es hora de reservar su próxima inyección')
    await settle()
    expect(mail.messages.filter(m => m.to.includes('bernard@demo.tidewell.test') && m.subject === 'Time to book your next injection')).toHaveLength(0)
  })
})

describe('appointment reminders (clinic default lead days 7 and 1; common practice)', () => {
  it('arrive over SMTP 7 days and 1 day before, with the calendar file, and a second run sends nothing twice', async () => {
    const appointment = (await nurse.get(`/api/patients/${ids['LPU-1001']}/schedule`)).body.nextAppointment
    const isReminder = (m: CaughtMessage) => m.to.includes('patient@demo.tidewell.test') && m.subject.startsWith('Reminder:')

    const first = await runReminders(morningOf(appointment.localDate, -7))
    expect(first.reminders).toBeGreaterThanOrEqual(1)
    const week = await mail.waitFor(isReminder)
    expect(week.subject).toContain('Reminder: your clinic appointment on')
    expect(week.text).toContain('Larkspur Point Urology, injection room 2')
    const event = calendarIn(week)
    expect(event.start.toISOString()).toBe(appointment.startsAt)
    expect(event.summary).toBe('Injection appointment at Larkspur Point Urology')

    expect(await runReminders(morningOf(appointment.localDate, -7))).toMatchObject({ reminders: 0, pleaseBook: 0 })
    // A run two days later is still inside the 7-day reminder: nothing new for him.
    await runReminders(morningOf(appointment.localDate, -5))
    await settle()
    expect(mail.messages.filter(isReminder)).toHaveLength(1)

    await runReminders(morningOf(appointment.localDate, -1))
    await settle()
    expect(mail.messages.filter(isReminder)).toHaveLength(2)
    await runReminders(morningOf(appointment.localDate, -1))
    await settle()
    expect(mail.messages.filter(isReminder)).toHaveLength(2)
  })

  it('are written in the patient\'s language', async () => {
    const appointment = (await nurse.get(`/api/patients/${ids['LPU-1007']}/schedule`)).body.nextAppointment
    await runReminders(morningOf(appointment.localDate, -1))
    const message = await mail.waitFor(m => m.to.includes('ramon@demo.tidewell.test') && m.subject.startsWith('Recordatorio:'))
    expect(message.subject).toContain('Recordatorio: su cita en la clínica el')
    expect(message.text).toContain('Le recordamos su cita para la inyección')
    expect(calendarIn(message).summary).toBe('Cita para la inyección en Larkspur Point Urology')
  })
})

describe('"please book"', () => {
  it('goes once to a patient with no appointment when his due date is 10 days away', async () => {
    const schedule = (await nurse.get(`/api/patients/${ids['LPU-1008']}/schedule`)).body
    expect(schedule.nextAppointment).toBeNull()
    const isPleaseBook = (m: CaughtMessage) => m.to.includes('cyril@demo.tidewell.test') && m.subject === 'Time to book your next injection'

    await runReminders(morningOf(schedule.dueDate, -11))
    await settle()
    expect(mail.messages.filter(isPleaseBook)).toHaveLength(0)

    const run = await runReminders(morningOf(schedule.dueDate, -10))
    expect(run.pleaseBook).toBeGreaterThanOrEqual(1)
    const message = await mail.waitFor(isPleaseBook)
    expect(message.text).toContain('no appointment is booked yet')
    expect(message.attachments).toHaveLength(0)

    await runReminders(morningOf(schedule.dueDate, -10))
    await runReminders(morningOf(schedule.dueDate, -9))
    await runReminders(morningOf(schedule.dueDate, -3))
    await settle()
    expect(mail.messages.filter(isPleaseBook)).toHaveLength(1)
  })
})
