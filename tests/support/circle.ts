import { expect } from 'vitest'
import { Client } from './client'
import type { MailCatcher } from './mail-catcher'
import { linkIn } from './mail-catcher'

export interface CircleInvite {
  email: string
  name: string
  canLogDiary?: boolean
  canManageAppointments?: boolean
  canMessage?: boolean
  language?: 'en' | 'es'
}

/** The raw token from the newest invitation e-mail sent to this address. */
export async function invitationToken(mail: MailCatcher, email: string, after = 0): Promise<string> {
  const message = await mail.waitFor(m => m.to.includes(email) && mail.messages.indexOf(m) >= after)
  return new URL(linkIn(message.text)).searchParams.get('token')!
}

/**
 * Invites someone new to a patient's circle (as `by`), follows the e-mail link and accepts
 * with a new password. Returns the caregiver, signed in by the acceptance, and the grant id.
 */
export async function addCaregiver(baseUrl: string, mail: MailCatcher, by: Client, patientId: number, invite: CircleInvite) {
  const before = mail.messages.length
  const sent = await by.post(`/api/patients/${patientId}/circle`, { canLogDiary: false, canManageAppointments: false, ...invite })
  expect(sent.status, JSON.stringify(sent.body)).toBe(201)
  const token = await invitationToken(mail, invite.email, before)
  const caregiver = new Client(baseUrl)
  const accepted = await caregiver.post(`/api/circle-invitations/${token}/accept`, { name: invite.name, password: 'lanterns along the quay' })
  expect(accepted.status, JSON.stringify(accepted.body)).toBe(200)
  const circle = await by.get(`/api/patients/${patientId}/circle`)
  const grant = (circle.body.members as { id: number, caregiver: { email: string } }[]).find(m => m.caregiver.email === invite.email)!
  return { caregiver, grantId: grant.id }
}

/** Clinic number -> patient id, read from the roster by a nurse. */
export async function patientIds(baseUrl: string): Promise<Record<string, number>> {
  const nurse = await Client.signIn(baseUrl, 'nurse2@demo.tidewell.test')
  const roster = (await nurse.get('/api/patients')).body as { id: number, clinicNumber: string }[]
  return Object.fromEntries(roster.map(p => [p.clinicNumber, p.id]))
}

/** The invitation links sent to one address, from the app's own mail catcher (read as an admin): for browser tests, which share one server. */
export async function sentInvitationLinks(baseUrl: string, email: string, count: number): Promise<string[]> {
  const admin = await Client.signIn(baseUrl, 'admin@demo.tidewell.test')
  const deadline = Date.now() + 15_000
  while (Date.now() < deadline) {
    const { messages } = (await admin.get('/api/admin/mail')).body as { messages: { to: string, text: string }[] }
    const found = messages.filter(m => m.to.includes(email))
    if (found.length >= count) return found.map(m => linkIn(m.text))
    await new Promise(r => setTimeout(r, 200))
  }
  throw new Error(`fewer than ${count} invitations for ${email}`)
}
