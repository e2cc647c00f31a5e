import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { addCaregiver, invitationToken, patientIds } from '../support/circle'
import { Client } from '../support/client'
import { diaryEntry } from '../support/diary'
import { linkIn, MailCatcher } from '../support/mail-catcher'

let app: RunningApp
let mail: MailCatcher
let ids: Record<string, number>

beforeAll(async () => {
  mail = await MailCatcher.start()
  app = await startApp({ smtpUrl: mail.url })
  ids = await patientIds(app.url)
})
afterAll(async () => {
  await app?.stop()
  await mail?.stop()
})

interface AuditLine { actor: { name: string } | null, actorRole: string, patient: { id: number } | null, action: string, outcome: string, resource: string, ip: string | null }

async function auditLines(query: Record<string, string | number>): Promise<AuditLine[]> {
  const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
  const reply = await admin.get(`/api/audit?${new URLSearchParams(Object.entries(query).map(([k, v]) => [k, String(v)]))}`)
  expect(reply.status).toBe(200)
  return reply.body.events
}

describe('inviting a caregiver who is new to Tidewell', () => {
  it('sends the e-mail in the caregiver\'s language without the patient\'s name; the link shows who invited him and works once', async () => {
    const franklin = await Client.signIn(app.url, 'franklin@demo.tidewell.test')
    const patientId = ids['LPU-1005']!
    const sent = await franklin.post(`/api/patients/${patientId}/circle`, {
      name: 'Adaeze Osei-Mensah', email: 'adaeze@demo.tidewell.test', language: 'es', canLogDiary: true, canManageAppointments: false,
    })
    expect(sent.status).toBe(201)
    expect(sent.body).toMatchObject({ email: 'adaeze@demo.tidewell.test', canLogDiary: true, canManageAppointments: false, expired: false, invitedBy: { name: 'Franklin Osei-Mensah', role: 'patient', onBehalf: false } })
    expect(JSON.stringify(sent.body)).not.toMatch(/token/i)

    const message = await mail.waitFor(m => m.to.includes('adaeze@demo.tidewell.test'))
    expect(message.subject).toBe('Le invitaron a un círculo de cuidado en Tidewell')
    expect(message.text).toContain('Hola, Adaeze Osei-Mensah:')
    expect(message.text).toContain('72 horas')
    expect(message.text).not.toContain('Franklin')
    const link = new URL(linkIn(message.text))
    expect(link.pathname).toBe('/circle/accept')
    const token = link.searchParams.get('token')!

    const visitor = new Client(app.url)
    const preview = await visitor.get(`/api/circle-invitations/${token}`)
    expect(preview.status).toBe(200)
    expect(preview.body).toMatchObject({
      patientName: 'Franklin Osei-Mensah', caregiverName: 'Adaeze Osei-Mensah', email: 'adaeze@demo.tidewell.test',
      canLogDiary: true, canManageAppointments: false, account: 'new', signedInAsInvitee: false,
    })

    const common = await visitor.post(`/api/circle-invitations/${token}/accept`, { name: 'Adaeze Osei-Mensah', password: 'password1234' })
    expect(common.status).toBe(400)
    expect(common.body.data.fieldErrors.password).toContain('validation.password.common')
    const missing = await visitor.post(`/api/circle-invitations/${token}/accept`, {})
    expect(missing.status).toBe(400)

    const accepted = await visitor.post(`/api/circle-invitations/${token}/accept`, { name: 'Adaeze Osei-Mensah', password: 'harbour lights at dusk' })
    expect(accepted.status).toBe(200)
    expect(accepted.body).toEqual({ patientId, newAccount: true })
    // The acceptance signed her in, as a caregiver in her language.
    const session = (await visitor.get('/api/_auth/session')).body.user
    expect(session).toMatchObject({ name: 'Adaeze Osei-Mensah', role: 'caregiver', language: 'es', patientId: null })
    expect((await visitor.get('/api/me/patients')).body).toEqual([
      { patientId, name: 'Franklin Osei-Mensah', relation: 'caregiver', canLogDiary: true, canManageAppointments: false, canMessage: false },
    ])
    expect((await visitor.get(`/api/patients/${patientId}`)).status).toBe(200)

    // Once only.
    expect((await new Client(app.url).post(`/api/circle-invitations/${token}/accept`, { name: 'X', password: 'another long sentence' })).status).toBe(404)
    expect((await new Client(app.url).get(`/api/circle-invitations/${token}`)).status).toBe(404)
    // She can sign in with the password she chose.
    await Client.signIn(app.url, 'adaeze@demo.tidewell.test', 'harbour lights at dusk')

    const circle = await franklin.get(`/api/patients/${patientId}/circle`)
    expect(circle.body.canManage).toBe(true)
    expect(circle.body.invitations).toEqual([])
    expect(circle.body.members).toEqual([expect.objectContaining({
      caregiver: expect.objectContaining({ name: 'Adaeze Osei-Mensah', email: 'adaeze@demo.tidewell.test' }),
      canLogDiary: true,
      canManageAppointments: false,
      grantedBy: { name: 'Franklin Osei-Mensah', role: 'patient', onBehalf: false },
    })])
  })

  it('refuses an unknown or malformed link with 404', async () => {
    const visitor = new Client(app.url)
    expect((await visitor.get(`/api/circle-invitations/${'a'.repeat(43)}`)).status).toBe(404)
    expect((await visitor.post(`/api/circle-invitations/${'a'.repeat(43)}/accept`, { name: 'X', password: 'a long enough sentence' })).status).toBe(404)
    expect((await visitor.get('/api/circle-invitations/short')).status).toBe(404)
  })
})

describe('inviting someone who already has a caregiver account', () => {
  it('asks him to sign in as the invited address, then adds the patient to his list', async () => {
    const kenji = await Client.signIn(app.url, 'kenji@demo.tidewell.test')
    const patientId = ids['LPU-1006']!
    const before = mail.messages.length
    expect((await kenji.post(`/api/patients/${patientId}/circle`, { name: 'Dana', email: 'DANA@demo.tidewell.test', canLogDiary: false, canManageAppointments: true })).status).toBe(201)
    const message = await mail.waitFor(m => m.to.includes('dana@demo.tidewell.test') && mail.messages.indexOf(m) >= before)
    expect(message.text).toContain('Hello Dana Achterberg,')
    const token = new URL(linkIn(message.text)).searchParams.get('token')!

    const anonymous = new Client(app.url)
    expect((await anonymous.get(`/api/circle-invitations/${token}`)).body).toMatchObject({ account: 'existing', signedInAsInvitee: false, caregiverName: 'Dana Achterberg' })
    const refused = await anonymous.post(`/api/circle-invitations/${token}/accept`, {})
    expect(refused.status).toBe(403)
    expect(refused.body.message).toBe('errors.circleSignInFirst')
    // Nor can someone else signed in accept it for her, even with a password.
    const other = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    expect((await other.post(`/api/circle-invitations/${token}/accept`, { password: 'a long enough sentence' })).status).toBe(403)

    const dana = await Client.signIn(app.url, 'dana@demo.tidewell.test')
    expect((await dana.get(`/api/circle-invitations/${token}`)).body.signedInAsInvitee).toBe(true)
    const accepted = await dana.post(`/api/circle-invitations/${token}/accept`, {})
    expect(accepted.status).toBe(200)
    expect(accepted.body.newAccount).toBe(false)
    const records = (await dana.get('/api/me/patients')).body as { patientId: number, name: string, canManageAppointments: boolean }[]
    expect(records.map(r => r.name)).toEqual(['Bernard Achterberg', 'Kenji Arakawa-Dunn'])
    expect(records.find(r => r.patientId === patientId)!.canManageAppointments).toBe(true)
    // Her password did not change.
    await Client.signIn(app.url, 'dana@demo.tidewell.test')
  })

  it('refuses to make a patient or staff account a caregiver, and says so on the link', async () => {
    const kenji = await Client.signIn(app.url, 'kenji@demo.tidewell.test')
    const patientId = ids['LPU-1006']!
    const before = mail.messages.length
    expect((await kenji.post(`/api/patients/${patientId}/circle`, { name: 'Nora', email: 'nurse@demo.tidewell.test', canLogDiary: false, canManageAppointments: false })).status).toBe(201)
    const token = await invitationToken(mail, 'nurse@demo.tidewell.test', before)
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    expect((await nurse.get(`/api/circle-invitations/${token}`)).body.account).toBe('unavailable')
    const reply = await nurse.post(`/api/circle-invitations/${token}/accept`, {})
    expect(reply.status).toBe(409)
    expect(reply.body.message).toBe('errors.circleAccountUnavailable')
  })

  it('refuses his own address and someone already in the circle, at the field', async () => {
    const patient = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const own = await patient.post(`/api/patients/${ids['LPU-1001']}/circle`, { name: 'Me', email: 'patient@demo.tidewell.test', canLogDiary: false, canManageAppointments: false })
    expect(own.status).toBe(400)
    expect(own.body.data.fieldErrors.email).toEqual(['validation.circle.notYourself'])
    const twice = await patient.post(`/api/patients/${ids['LPU-1001']}/circle`, { name: 'Marisol', email: 'caregiver@demo.tidewell.test', canLogDiary: false, canManageAppointments: false })
    expect(twice.status).toBe(409)
    expect(twice.body.data.fieldErrors.email).toEqual(['validation.circle.alreadyMember'])
    const bad = await patient.post(`/api/patients/${ids['LPU-1001']}/circle`, { name: '', email: 'not an address', canLogDiary: 'yes' })
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fieldErrors).sort()).toEqual(['canLogDiary', 'canManageAppointments', 'email', 'name'])
    const link = await patient.post(`/api/patients/${ids['LPU-1001']}/circle`, { name: 'Click http://example.org', email: 'someone@demo.tidewell.test', canLogDiary: false, canManageAppointments: false })
    expect(link.body.data.fieldErrors.name).toEqual(['validation.circle.nameNoLinks'])
  })

  it('a withdrawn invitation link stops working; sending again replaces the earlier link', async () => {
    const cyril = await Client.signIn(app.url, 'cyril@demo.tidewell.test')
    const patientId = ids['LPU-1008']!
    const before = mail.messages.length
    const first = await cyril.post(`/api/patients/${patientId}/circle`, { name: 'Imogen Hathersage', email: 'imogen@demo.tidewell.test', canLogDiary: false, canManageAppointments: false })
    const firstToken = await invitationToken(mail, 'imogen@demo.tidewell.test', before)
    const again = mail.messages.length
    const second = await cyril.post(`/api/patients/${patientId}/circle`, { name: 'Imogen Hathersage', email: 'imogen@demo.tidewell.test', canLogDiary: true, canManageAppointments: false })
    const secondToken = await invitationToken(mail, 'imogen@demo.tidewell.test', again)
    expect((await new Client(app.url).get(`/api/circle-invitations/${firstToken}`)).status).toBe(404)
    expect((await new Client(app.url).get(`/api/circle-invitations/${secondToken}`)).status).toBe(200)
    const circle = await cyril.get(`/api/patients/${patientId}/circle`)
    expect(circle.body.invitations.map((i: { id: number }) => i.id)).toEqual([second.body.id])
    expect(first.body.id).not.toBe(second.body.id)

    expect((await cyril.delete(`/api/patients/${patientId}/circle/invitations/${second.body.id}`)).status).toBe(204)
    expect((await new Client(app.url).get(`/api/circle-invitations/${secondToken}`)).status).toBe(404)
    expect((await cyril.delete(`/api/patients/${patientId}/circle/invitations/${second.body.id}`)).status).toBe(404)
    expect((await cyril.get(`/api/patients/${patientId}/circle`)).body.invitations).toEqual([])
  })
})

describe('staff on the patient\'s behalf', () => {
  it('a nurse invites for the patient; the grant and the audit trail say so; a clinician may look but not change', async () => {
    const nurse = await Client.signIn(app.url, 'nurse@demo.tidewell.test')
    const patientId = ids['LPU-1009']!
    const { caregiver } = await addCaregiver(app.url, mail, nurse, patientId, { name: 'Rosalind Laurier', email: 'rosalind@demo.tidewell.test', canManageAppointments: true })
    expect((await caregiver.get(`/api/patients/${patientId}`)).status).toBe(200)

    const desmond = await Client.signIn(app.url, 'desmond@demo.tidewell.test')
    const circle = await desmond.get(`/api/patients/${patientId}/circle`)
    expect(circle.body.members[0].grantedBy).toEqual({ name: 'Nora Lindqvist', role: 'nurse', onBehalf: true })

    const lines = await auditLines({ patient: patientId })
    const nurseLines = lines.filter(l => l.actor?.name === 'Nora Lindqvist')
    expect(nurseLines.map(l => l.action)).toEqual(expect.arrayContaining(['circle.manage', 'circle.invite']))
    expect(nurseLines.find(l => l.action === 'circle.manage')!.resource).toBe(`POST /api/patients/${patientId}/circle`)
    expect(lines.find(l => l.action === 'circle.accept')).toMatchObject({ actor: { name: 'Rosalind Laurier' }, actorRole: 'caregiver', outcome: 'done' })

    const clinician = await Client.signIn(app.url, 'clinician@demo.tidewell.test')
    const seen = await clinician.get(`/api/patients/${patientId}/circle`)
    expect(seen.status).toBe(200)
    expect(seen.body.canManage).toBe(false)
    expect((await clinician.post(`/api/patients/${patientId}/circle`, { name: 'X', email: 'x@demo.tidewell.test', canLogDiary: false, canManageAppointments: false })).status).toBe(403)
  })
})

describe('changing and removing', () => {
  it('new permissions apply on the caregiver\'s next request', async () => {
    const ramon = await Client.signIn(app.url, 'ramon@demo.tidewell.test')
    const patientId = ids['LPU-1007']!
    const { caregiver, grantId } = await addCaregiver(app.url, mail, ramon, patientId, { name: 'Pilar Espinal', email: 'pilar@demo.tidewell.test', canLogDiary: true })
    expect((await caregiver.post(`/api/patients/${patientId}/diary`, diaryEntry())).status).toBe(201)

    const changed = await ramon.patch(`/api/patients/${patientId}/circle/${grantId}`, { canLogDiary: false, canManageAppointments: true })
    expect(changed.status).toBe(200)
    expect(changed.body).toMatchObject({ canLogDiary: false, canManageAppointments: true, changedBy: { name: 'Ramón Espinal Tovar', role: 'patient', onBehalf: false } })
    expect((await caregiver.post(`/api/patients/${patientId}/diary`, diaryEntry())).status).toBe(403)
    expect((await caregiver.get('/api/me/patients')).body[0]).toMatchObject({ canLogDiary: false, canManageAppointments: true })

    expect((await ramon.patch(`/api/patients/${patientId}/circle/${grantId}`, { canLogDiary: true })).status).toBe(400)
    // Another patient's grant id is not his to change.
    const elias = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    expect((await elias.patch(`/api/patients/${ids['LPU-1001']}/circle/${grantId}`, { canLogDiary: true, canManageAppointments: true })).status).toBe(404)
    expect((await elias.delete(`/api/patients/${ids['LPU-1001']}/circle/${grantId}`)).status).toBe(404)
  })

  it('the messages permission is granted like the others, and a change that leaves it out keeps it', async () => {
    const desmond = await Client.signIn(app.url, 'desmond@demo.tidewell.test')
    const patientId = ids['LPU-1009']!
    const { caregiver, grantId } = await addCaregiver(app.url, mail, desmond, patientId, { name: 'Ottoline Laurier', email: 'ottoline@demo.tidewell.test', canMessage: true })
    expect((await caregiver.get('/api/me/patients')).body[0]).toMatchObject({ canLogDiary: false, canManageAppointments: false, canMessage: true })
    expect((await caregiver.get(`/api/patients/${patientId}/messages`)).status).toBe(200)
    const kept = await desmond.patch(`/api/patients/${patientId}/circle/${grantId}`, { canLogDiary: true, canManageAppointments: false })
    expect(kept.body).toMatchObject({ canLogDiary: true, canMessage: true })
    const off = await desmond.patch(`/api/patients/${patientId}/circle/${grantId}`, { canLogDiary: true, canManageAppointments: false, canMessage: false })
    expect(off.body).toMatchObject({ canMessage: false })
    expect((await caregiver.get(`/api/patients/${patientId}/messages`)).status).toBe(403)
  })

  it('removal takes effect on the very next request, in the same session', async () => {
    const luis = await Client.signIn(app.url, 'luis@demo.tidewell.test')
    const patientId = ids['LPU-1003']!
    const { caregiver, grantId } = await addCaregiver(app.url, mail, luis, patientId, { name: 'Beatriz Calderón', email: 'beatriz@demo.tidewell.test', canLogDiary: true, canManageAppointments: true })
    expect((await caregiver.get(`/api/patients/${patientId}`)).status).toBe(200)

    expect((await luis.delete(`/api/patients/${patientId}/circle/${grantId}`)).status).toBe(204)

    expect((await caregiver.get(`/api/patients/${patientId}`)).status).toBe(404)
    expect((await caregiver.post(`/api/patients/${patientId}/diary`, diaryEntry())).status).toBe(404)
    expect((await caregiver.get('/api/me/patients')).body).toEqual([])
    expect((await caregiver.get('/api/_auth/session')).body.user.name).toBe('Beatriz Calderón')
    expect((await luis.get(`/api/patients/${patientId}/circle`)).body.members).toEqual([])
    expect((await luis.delete(`/api/patients/${patientId}/circle/${grantId}`)).status).toBe(404)
    // She is told by e-mail (in her language), naming no one and nothing clinical, once.
    const ended = ['Your place in a care circle in Tidewell has ended', 'Terminó su lugar en un círculo de cuidado de Tidewell']
    const told = await mail.waitFor(m => m.to.includes('beatriz@demo.tidewell.test') && ended.includes(m.subject))
    expect(`${told.subject} ${told.text}`).not.toMatch(/Luis|Calderón Ybarra|LPU-1003/)
    await new Promise(resolve => setTimeout(resolve, 800))
    expect(mail.messages.filter(m => m.to.includes('beatriz@demo.tidewell.test') && ended.includes(m.subject))).toHaveLength(1)
    const refused = await auditLines({ patient: patientId, outcome: 'refused-policy' })
    expect(refused.filter(l => l.actor?.name === 'Beatriz Calderón').map(l => l.action).sort()).toEqual(['diary.write', 'patient.read'])
  })
})

describe('the audit trail', () => {
  it('a caregiver of patient A asking for patient B gets 404, and the attempt is recorded with role, resource and IP', async () => {
    const marisol = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    const bernard = ids['LPU-1002']!
    expect((await marisol.get(`/api/patients/${bernard}`)).status).toBe(404)
    expect((await marisol.get(`/api/patients/${bernard}/diary`)).status).toBe(404)
    const lines = await auditLines({ patient: bernard, outcome: 'refused-policy' })
    const hers = lines.filter(l => l.actor?.name === 'Marisol Marwood')
    expect(hers.map(l => l.resource).sort()).toEqual([`GET /api/patients/${bernard}`, `GET /api/patients/${bernard}/diary`])
    for (const line of hers) expect(line).toMatchObject({ actorRole: 'caregiver', action: 'patient.read', outcome: 'refused-policy', ip: expect.stringMatching(/127\.0\.0\.1/) })
  })
})

describe('what a caregiver enters carries his name', () => {
  it('the patient and the nurse both see the caregiver\'s name on the entry', async () => {
    const marisol = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    const elias = ids['LPU-1001']!
    const entry = await marisol.post(`/api/patients/${elias}/diary`, diaryEntry({ hotFlushes: { perDay: 3, worstSeverity: 'mild', interference: 'none' } }))
    expect(entry.status).toBe(201)
    for (const email of ['patient@demo.tidewell.test', 'nurse@demo.tidewell.test']) {
      const reader = await Client.signIn(app.url, email)
      const list = await reader.get(`/api/patients/${elias}/diary`)
      const shown = (list.body.entries as { id: number, enteredBy: unknown }[]).find(e => e.id === entry.body.id)
      expect(shown?.enteredBy, email).toEqual({ name: 'Marisol Marwood', relation: 'caregiver' })
      const one = await reader.get(`/api/patients/${elias}/diary/${entry.body.id}`)
      expect(one.body.enteredBy, email).toEqual({ name: 'Marisol Marwood', relation: 'caregiver' })
    }
  })
})

describe('access history', () => {
  it('shows the patient who opened or changed his record, not his own visits, and only to him', async () => {
    const odellId = ids['LPU-1004']!
    const odell = await Client.signIn(app.url, 'odell@demo.tidewell.test')
    await odell.get(`/api/patients/${odellId}`)
    const nurse = await Client.signIn(app.url, 'nurse2@demo.tidewell.test')
    await nurse.get(`/api/patients/${odellId}`)
    await nurse.get(`/api/patients/${odellId}/circle`)
    // Free slots need appointment.schedule, but reading them is still a look.
    expect((await nurse.get(`/api/patients/${odellId}/slots`)).status).toBe(200)
    // A refused attempt is for the admins' trail, not his page.
    const marisol = await Client.signIn(app.url, 'caregiver@demo.tidewell.test')
    await marisol.get(`/api/patients/${odellId}`)

    const history = await odell.get(`/api/patients/${odellId}/access-history`)
    expect(history.status).toBe(200)
    // One line per person, day and kind: his three looks and the roster reads (patientIds) of the same nurse today.
    const groups = history.body.groups as { actor: { name: string, role: string }, kind: string, count: number, actions: string[] }[]
    expect(groups.map(g => [g.actor.name, g.actor.role, g.kind])).toEqual([['Tobias Mwangi', 'nurse', 'read']])
    expect(groups[0]!.actions).toEqual(expect.arrayContaining(['appointment.schedule', 'circle.read', 'patient.read', 'roster.read']))
    expect(groups[0]!.count).toBeGreaterThanOrEqual(4)
    expect(JSON.stringify(history.body)).not.toMatch(/resource|"ip"|email/)

    expect((await nurse.get(`/api/patients/${odellId}/access-history`)).status).toBe(403)
    expect((await marisol.get(`/api/patients/${odellId}/access-history`)).status).toBe(404)
    expect((await odell.get(`/api/patients/${ids['LPU-1001']}/access-history`)).status).toBe(404)
  })
})
