import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { MailCatcher } from '../support/mail-catcher'

/*
 * Cancelling an appointment: the patient asks, the clinic cancels with a reason, he is told
 * (by e-mail without the reason, in the app with it) and his injection is still due.
 */

let app: RunningApp
let mail: MailCatcher
let nurse: Client
const ids: Record<string, number> = {}

beforeAll(async () => {
  mail = await MailCatcher.start()
  app = await startApp({ smtpUrl: mail.url })
  nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
  for (const p of (await nurse.get('/api/patients')).body as { id: number, clinicNumber: string }[]) ids[p.clinicNumber] = p.id
})
afterAll(async () => {
  await app?.stop()
  await mail?.stop()
})

const ASK_ID = '3f1c2b7e-8d4a-4c6e-9b1f-2a5d7e8c9f01'

describe('cancelling an appointment', () => {
  it('the patient asks to cancel, staff cancel with a reason, he is told and the injection stays due', async () => {
    const cyril = ids['LPU-1008']!
    const schedule = (await nurse.get(`/api/patients/${cyril}/schedule`)).body
    const booked = await nurse.post(`/api/patients/${cyril}/appointments`, { date: schedule.dueDate, time: '14:00', place: 'Injection room 1', durationMinutes: 30 })
    expect(booked.status).toBe(201)

    const patient = await Client.signIn(app.url, 'cyril@demo.tidewell.test')
    // The confirmation has to be the literal true the button sends.
    const unconfirmed = await patient.post(`/api/appointments/${booked.body.id}/cancel-request`, { cancel: false })
    expect(unconfirmed.status).toBe(400)
    expect(unconfirmed.body.data.fieldErrors).toEqual({ cancel: ['validation.schedule.cancelConfirm'] })
    const nursesBefore = mail.messages.length
    const asked = await patient.post(`/api/appointments/${booked.body.id}/cancel-request`, { cancel: true, note: 'I will be away that week.', requestId: ASK_ID })
    expect(asked.status).toBe(201)
    expect(asked.body).toMatchObject({ status: 'change-requested', openRequest: { kind: 'cancel', preferredDates: [], note: 'I will be away that week.' } })
    // A retry with the same request id: the first request back, no second one.
    const retried = await patient.post(`/api/appointments/${booked.body.id}/cancel-request`, { cancel: true, note: 'I will be away that week.', requestId: ASK_ID })
    expect(retried.status).toBe(200)
    expect(retried.body.changeRequest.id).toBe(asked.body.changeRequest.id)
    const told = await mail.waitFor(m => mail.messages.indexOf(m) >= nursesBefore && m.subject === 'A patient asked for another appointment time')
    expect(told.text).not.toContain('Cyril')

    const open = (await nurse.get('/api/change-requests')).body.rows as { id: number, kind: string, patient: { clinicNumber: string } }[]
    expect(open.find(r => r.patient.clinicNumber === 'LPU-1008')).toMatchObject({ id: asked.body.changeRequest.id, kind: 'cancel' })

    // Only staff cancel; a reason is required.
    expect((await patient.post(`/api/appointments/${booked.body.id}/cancel`, { reason: 'Changed my mind' })).status).toBe(403)
    const noReason = await nurse.post(`/api/appointments/${booked.body.id}/cancel`, { reason: '   ' })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.fieldErrors).toEqual({ reason: ['validation.schedule.cancelReason'] })

    const before = mail.messages.length
    const reason = 'Cancelled as you asked; please call to book a date after your trip.'
    const cancelled = await nurse.post(`/api/appointments/${booked.body.id}/cancel`, { reason })
    expect(cancelled.status).toBe(200)
    expect(cancelled.body).toMatchObject({ id: booked.body.id, status: 'cancelled', openRequest: null, lastAnswer: { decision: 'cancel', note: reason, answeredBy: 'Nora Lindqvist' } })
    // Of two cancels, the second finds it closed.
    expect((await nurse.post(`/api/appointments/${booked.body.id}/cancel`, { reason: 'Again' })).status).toBe(409)
    expect(((await nurse.get('/api/change-requests')).body.rows as { id: number }[]).map(r => r.id)).not.toContain(asked.body.changeRequest.id)

    const message = await mail.waitFor(m => mail.messages.indexOf(m) >= before && m.to.includes('cyril@demo.tidewell.test'))
    expect(message.subject).toBe('Your clinic appointment was cancelled')
    expect(message.text).toContain('Hello Cyril Hathersage,')
    expect(message.text).not.toContain('trip')
    expect(message.text).toContain('Your injection is still due')

    // Today: no next appointment, the cancellation with its reason, and still due.
    const seen = (await patient.get(`/api/patients/${cyril}/schedule`)).body
    expect(seen.nextAppointment).toBeNull()
    expect(seen.lastCancelled).toMatchObject({ id: booked.body.id, localDate: schedule.dueDate, localTime: '14:00', reason })
    expect(seen.dueDate).toBe(schedule.dueDate)
    // A later booking takes its place.
    const rebooked = await nurse.post(`/api/patients/${cyril}/appointments`, { date: schedule.dueDate, time: '15:00', place: 'Injection room 1' })
    expect(rebooked.status).toBe(201)
    const after = (await patient.get(`/api/patients/${cyril}/schedule`)).body
    expect(after.nextAppointment).toMatchObject({ id: rebooked.body.id })
    expect(after.lastCancelled).toBeNull()
  })

  it('a view-only caregiver cannot ask to cancel (403); one allowed to manage appointments can, and the request shows who asked', async () => {
    // Demo circle: Dana sees Bernard's schedule only; Marisol manages Elias's appointments.
    const dana = await Client.signIn(app.url, 'dana@demo.tidewell.test')
    const bernards = (await nurse.get(`/api/patients/${ids['LPU-1002']}/schedule`)).body.nextAppointment
    expect((await dana.post(`/api/appointments/${bernards.id}/cancel-request`, { cancel: true })).status).toBe(403)
    expect((await nurse.get(`/api/patients/${ids['LPU-1002']}/schedule`)).body.nextAppointment).toMatchObject({ id: bernards.id, status: bernards.status, openRequest: null })

    const marisol = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    const elias = (await nurse.get(`/api/patients/${ids['LPU-1001']}/schedule`)).body.nextAppointment
    const asked = await marisol.post(`/api/appointments/${elias.id}/cancel-request`, { cancel: true })
    expect(asked.status).toBe(201)
    expect(asked.body.openRequest).toMatchObject({ kind: 'cancel', note: null, requestedBy: { name: 'Marisol Marwood', relation: 'caregiver' } })
  })
})
