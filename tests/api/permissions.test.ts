import { randomUUID } from 'node:crypto'
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { PDFDocument } from 'pdf-lib'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { addCaregiver, patientIds } from '../support/circle'
import { Client } from '../support/client'
import { diaryEntry } from '../support/diary'
import { MailCatcher } from '../support/mail-catcher'

/*
 * The permission table as data, run against the built server. Every route that touches
 * one patient's record is one line: method, path template, the action it asks the access
 * policy for, and (rarely) options. Every person below asks every route about the same
 * patient (Mateo Quiñones Reyes, LPU-1012) and must get the answer in EXPECTED.
 *
 * 'ok' means the policy let the request through to the route's own work: GET answers 200,
 * a POST/PUT/PATCH sent an empty body answers 400 at validation (so nothing changes), and a
 * DELETE of a fresh item answers 204. 404: he may not know the record exists. 403: he may
 * see the record but not do this.
 */

const ACTORS = ['self', 'otherPatient', 'caregiverNone', 'caregiverView', 'caregiverViewLog', 'caregiverViewAppointments', 'caregiverMessages', 'caregiverRevoked', 'nurse', 'clinician', 'admin'] as const
type Actor = (typeof ACTORS)[number]
type Answer = 'ok' | 403 | 404

const row = (...answers: Answer[]) => Object.fromEntries(ACTORS.map((actor, i) => [actor, answers[i]!])) as Record<Actor, Answer>

/*                                      self  other caregiver: none view view+log view+appts messages revoked  nurse clinician admin */
const EXPECTED: Record<string, Record<Actor, Answer>> = {
  'patient.read': /*                */ row('ok', 404, 404, 'ok', 'ok', 'ok', 'ok', 404, 'ok', 'ok', 'ok'),
  'diary.write': /*                 */ row('ok', 404, 404, 403, 'ok', 403, 403, 404, 403, 403, 403),
  'appointment.respond': /*         */ row('ok', 404, 404, 403, 403, 'ok', 403, 404, 403, 403, 403),
  'appointment.schedule': /*        */ row(403, 404, 404, 403, 403, 403, 403, 404, 'ok', 'ok', 'ok'),
  'injection.record': /*            */ row(403, 404, 404, 403, 403, 403, 403, 404, 'ok', 'ok', 403),
  'regimen.set': /*                 */ row(403, 404, 404, 403, 403, 403, 403, 404, 'ok', 'ok', 403),
  'labs.record': /*                 */ row(403, 404, 404, 403, 403, 403, 403, 404, 'ok', 'ok', 403),
  'circle.read': /*                 */ row('ok', 404, 404, 403, 403, 403, 403, 404, 'ok', 'ok', 'ok'),
  'circle.manage': /*               */ row('ok', 404, 404, 403, 403, 403, 403, 404, 'ok', 403, 'ok'),
  'access-history.read': /*         */ row('ok', 404, 404, 403, 403, 403, 403, 404, 403, 403, 403),
  'triage.work': /*                 */ row(403, 404, 404, 403, 403, 403, 403, 404, 'ok', 'ok', 403),
  'risk-profile.manage': /*         */ row(403, 404, 404, 403, 403, 403, 403, 404, 'ok', 'ok', 403),
  'contact.manage': /*              */ row('ok', 404, 404, 403, 403, 403, 403, 404, 'ok', 'ok', 'ok'),
  'monitoring.read': /*             */ row(403, 404, 404, 403, 403, 403, 403, 404, 'ok', 'ok', 403),
  'monitoring.manage': /*           */ row(403, 404, 404, 403, 403, 403, 403, 404, 403, 'ok', 403),
  // Issue 13: messages are a caregiver permission of their own; admins take no part.
  'message.read': /*                */ row('ok', 404, 404, 403, 403, 403, 'ok', 404, 'ok', 'ok', 403),
  'message.write': /*               */ row('ok', 404, 404, 403, 403, 403, 'ok', 404, 'ok', 'ok', 403),
  'message.manage': /*              */ row(403, 404, 404, 403, 403, 403, 403, 404, 'ok', 'ok', 403),
}

interface RouteOptions {
  /** Status of a request the policy allows, when not the default for the method. */
  ok?: number
  /** Roles the route lets in before asking about the patient (requireRole): everyone else gets 403. */
  roles?: Actor[]
}
type Route = [method: string, path: string, action: keyof typeof EXPECTED, options?: RouteOptions]

const NURSES_AND_CLINICIANS: Actor[] = ['nurse', 'clinician']

// One line per route. Path parameters are filled in by PARAMS below.
const ROUTES: Route[] = [
  ['GET', '/api/patients/:id', 'patient.read'],
  ['GET', '/api/patients/:id/schedule', 'patient.read'],
  ['GET', '/api/patients/:id/injections', 'patient.read'],
  ['GET', '/api/patients/:id/diary', 'patient.read'],
  ['GET', '/api/patients/:id/diary/:entryId', 'patient.read'],
  ['POST', '/api/patients/:id/diary', 'diary.write'],
  ['POST', '/api/patients/:id/diary/right-now', 'diary.write'],
  ['GET', '/api/patients/:id/risk-profile', 'risk-profile.manage'],
  ['PUT', '/api/patients/:id/risk-profile', 'risk-profile.manage'],
  ['GET', '/api/patients/:id/contact', 'patient.read'],
  ['PUT', '/api/patients/:id/contact', 'contact.manage'],
  ['GET', '/api/patients/:id/slots', 'appointment.schedule'],
  ['POST', '/api/patients/:id/appointments', 'appointment.schedule'],
  ['POST', '/api/patients/:id/injections', 'injection.record'],
  ['PUT', '/api/patients/:id/regimen', 'regimen.set'],
  ['GET', '/api/patients/:id/circle', 'circle.read'],
  ['POST', '/api/patients/:id/circle', 'circle.manage'],
  ['PATCH', '/api/patients/:id/circle/:grantId', 'circle.manage'],
  ['DELETE', '/api/patients/:id/circle/:grantId', 'circle.manage'],
  ['DELETE', '/api/patients/:id/circle/invitations/:invitationId', 'circle.manage'],
  ['GET', '/api/patients/:id/access-history', 'access-history.read'],
  ['GET', '/api/patients/:id/labs', 'patient.read'],
  ['POST', '/api/patients/:id/labs', 'labs.record'],
  ['GET', '/api/patients/:id/monitoring', 'monitoring.read'],
  ['PUT', '/api/patients/:id/monitoring', 'monitoring.manage'],
  ['POST', '/api/patients/:id/monitoring/defaults', 'monitoring.manage'],
  ['POST', '/api/patients/:id/monitoring/done', 'labs.record'],
  ['GET', '/api/patients/:id/monitoring/due', 'patient.read'],
  ['POST', '/api/patients/:id/visits', 'injection.record'],
  ['GET', '/api/patients/:id/visits/:visitId', 'injection.record'],
  ['POST', '/api/patients/:id/visits/:visitId/checks', 'injection.record'],
  ['POST', '/api/patients/:id/visits/:visitId/kits', 'injection.record'],
  ['POST', '/api/patients/:id/visits/:visitId/kits/:kitId/mixed', 'injection.record'],
  ['POST', '/api/patients/:id/visits/:visitId/kits/:kitId/discard', 'injection.record'],
  ['POST', '/api/patients/:id/visits/:visitId/give', 'injection.record'],
  ['POST', '/api/patients/:id/visits/:visitId/not-given', 'injection.record'],
  ['POST', '/api/patients/:id/visits/:visitId/after', 'injection.record'],
  ['GET', '/api/appointments/:id/calendar.ics', 'patient.read'],
  ['POST', '/api/appointments/:id/confirm', 'appointment.respond', { ok: 200 }],
  ['POST', '/api/appointments/:id/change-request', 'appointment.respond'],
  ['POST', '/api/appointments/:id/cancel-request', 'appointment.respond'],
  ['POST', '/api/appointments/:id/cancel', 'appointment.schedule'],
  ['POST', '/api/change-requests/:id/answer', 'appointment.schedule'],
  ['GET', '/api/triage/:id', 'triage.work', { roles: NURSES_AND_CLINICIANS }],
  ['POST', '/api/triage/:id/events', 'triage.work', { roles: NURSES_AND_CLINICIANS }],
  ['GET', '/api/patients/:id/messages', 'message.read'],
  ['POST', '/api/patients/:id/messages', 'message.write'],
  ['POST', '/api/patients/:id/messages/read', 'message.read'],
  ['POST', '/api/messages/:id/entered-in-error', 'message.manage'],
  // An empty JSON body is no file: 400 at the upload's own check.
  ['POST', '/api/patients/:id/attachments', 'message.write'],
  // A pending file is its uploader's alone (404 to everyone else): this one was sent with a message.
  ['GET', '/api/attachments/:id', 'message.read'],
  ['POST', '/api/attachments/:id/file', 'message.manage'],
]

const DEFAULT_OK: Record<string, number> = { GET: 200, POST: 400, PUT: 400, PATCH: 400, DELETE: 204 }

function expected([method, , action, options]: Route, actor: Actor): number {
  if (options?.roles && !options.roles.includes(actor)) return 403
  const answer = EXPECTED[action]![actor]
  return answer === 'ok' ? options?.ok ?? DEFAULT_OK[method]! : answer
}

let app: RunningApp
let mail: MailCatcher
const people = {} as Record<Actor, Client>
let mateo: Client
let ids: Record<string, number>
const fixed: Record<string, number> = {}

/** Ways to fill each path parameter: [pattern, value]; `allowed` asks for a fresh item to delete. */
const PARAMS: [RegExp, (allowed: boolean) => Promise<number> | number][] = [
  [/^\/api\/patients\/:id/, () => ids['LPU-1012']!],
  [/^\/api\/appointments\/:id/, () => fixed.appointment!],
  [/^\/api\/change-requests\/:id/, () => fixed.changeRequest!],
  [/^\/api\/triage\/:id/, () => fixed.triageItem!],
  [/^\/api\/messages\/:id/, () => fixed.message!],
  [/^\/api\/attachments\/:id/, () => fixed.attachment!],
  [/:entryId/, () => fixed.diaryEntry!],
  [/:visitId/, () => fixed.visit!],
  // Every kit route validates its body first: an empty one answers 400 before the kit is looked for.
  [/:kitId/, () => 1],
  [/:grantId/, allowed => (allowed ? freshGrant() : fixed.grant!)],
  [/:invitationId/, allowed => (allowed ? freshInvitation() : fixed.invitation!)],
]

async function resolve(path: string, allowed: boolean): Promise<string> {
  let result = path
  for (const [pattern, value] of PARAMS) {
    const match = result.match(pattern)
    if (match) result = result.replace(match[0], match[0].replace(/:\w+$/, String(await value(allowed))))
  }
  expect(result, `unfilled parameter in ${path}`).not.toMatch(/:\w/)
  return result
}

let freshCount = 0
async function freshGrant(): Promise<number> {
  const n = ++freshCount
  const { grantId } = await addCaregiver(app.url, mail, mateo, ids['LPU-1012']!, { name: `Helper ${n}`, email: `helper${n}@demo.tidewell.test` })
  return grantId
}
async function freshInvitation(): Promise<number> {
  const n = ++freshCount
  const reply = await mateo.post(`/api/patients/${ids['LPU-1012']}/circle`, { name: `Invitee ${n}`, email: `invitee${n}@demo.tidewell.test`, canLogDiary: false, canManageAppointments: false })
  return reply.body.id
}

beforeAll(async () => {
  mail = await MailCatcher.start()
  app = await startApp({ smtpUrl: mail.url })
  ids = await patientIds(app.url)
  const patientId = ids['LPU-1012']!
  mateo = await Client.signIn(app.url, 'mateo@demo.tidewell.test')
  const add = (email: string, flags: { canLogDiary?: boolean, canManageAppointments?: boolean, canMessage?: boolean }) =>
    addCaregiver(app.url, mail, mateo, patientId, { name: email.split('@')[0]!, email, ...flags })
  const view = await add('view@demo.tidewell.test', {})
  const viewLog = await add('view-log@demo.tidewell.test', { canLogDiary: true })
  const viewAppointments = await add('view-appointments@demo.tidewell.test', { canManageAppointments: true })
  const viewMessages = await add('view-messages@demo.tidewell.test', { canMessage: true })
  const revoked = await add('revoked@demo.tidewell.test', { canLogDiary: true, canManageAppointments: true, canMessage: true })
  expect((await mateo.delete(`/api/patients/${patientId}/circle/${revoked.grantId}`)).status).toBe(204)
  Object.assign(people, {
    self: mateo,
    otherPatient: await Client.signIn(app.url, 'augustin@demo.tidewell.test'),
    caregiverNone: await Client.signIn(app.url, 'dana@demo.tidewell.test'),
    caregiverView: view.caregiver,
    caregiverViewLog: viewLog.caregiver,
    caregiverViewAppointments: viewAppointments.caregiver,
    caregiverMessages: viewMessages.caregiver,
    caregiverRevoked: revoked.caregiver,
    nurse: await Client.signIn(app.url, 'nurse@demo.tidewell.test'),
    clinician: await Client.signIn(app.url, 'clinician@demo.tidewell.test'),
    admin: await Client.signIn(app.url, 'admin@demo.tidewell.test'),
  })
  fixed.grant = view.grantId
  fixed.invitation = await freshInvitation()

  // His own records for the routes about one item: an emergency diary entry (which opens a
  // triage queue item) and his next appointment with its open change request (demo seed).
  const entry = await mateo.post(`/api/patients/${patientId}/diary`, diaryEntry({ rightNow: { newWeakness: true } }))
  expect(entry.status).toBe(201)
  fixed.diaryEntry = entry.body.id
  const schedule = (await mateo.get(`/api/patients/${patientId}/schedule`)).body
  fixed.appointment = schedule.nextAppointment.id
  fixed.changeRequest = schedule.nextAppointment.openRequest.id
  const queue = (await people.nurse.get('/api/triage')).body.items as { id: number, patientId: number }[]
  fixed.triageItem = queue.find(item => item.patientId === patientId)!.id
  // A walk-in visit for him, for the routes about one visit.
  const visit = await people.nurse.post(`/api/patients/${patientId}/visits`, { appointmentId: null })
  expect(visit.status).toBe(201)
  fixed.visit = visit.body.id
  // A message of his with a file, for the routes about one message or attachment.
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(await minimalPdf())], { type: 'application/pdf' }), 'letter.pdf')
  const uploaded = await fetch(new URL(`/api/patients/${patientId}/attachments`, app.url), { method: 'POST', headers: { origin: new URL(app.url).origin, cookie: mateo.cookieHeader() }, body: form })
  expect(uploaded.status).toBe(201)
  fixed.attachment = (await uploaded.json()).id
  const message = await mateo.post(`/api/patients/${patientId}/messages`, { subject: 'Una pregunta', body: '¿Puedo viajar?', rightNow: [], attachmentIds: [fixed.attachment], requestId: randomUUID() })
  expect(message.status).toBe(201)
  fixed.message = message.body.id
})

async function minimalPdf() {
  const document = await PDFDocument.create()
  document.addPage()
  return Buffer.from(await document.save())
}
afterAll(async () => {
  await app?.stop()
  await mail?.stop()
})

describe('the permission table', () => {
  for (const route of ROUTES) {
    const [method, path] = route
    for (const actor of ACTORS) {
      const status = expected(route, actor)
      it(`${method} ${path} as ${actor} -> ${status}`, async () => {
        const url = await resolve(path, status === DEFAULT_OK[method] || status === route[3]?.ok)
        const body = method === 'GET' || method === 'DELETE' ? undefined : {}
        const reply = await people[actor].request(method, url, body)
        expect(reply.status, JSON.stringify(reply.body).slice(0, 300)).toBe(status)
      })
    }
  }
})

describe('what the circle page may offer', () => {
  // From the circle.manage row above, for the people who may read the circle at all.
  const MAY_MANAGE: Partial<Record<Actor, boolean>> = { self: true, nurse: true, clinician: false, admin: true }
  for (const [actor, mayManage] of Object.entries(MAY_MANAGE) as [Actor, boolean][]) {
    it(`GET /api/patients/:id/circle as ${actor} says canManage ${mayManage}`, async () => {
      const reply = await people[actor].get(`/api/patients/${ids['LPU-1012']}/circle`)
      expect(reply.status).toBe(200)
      expect(reply.body.canManage).toBe(mayManage)
    })
  }
})

describe('the table covers every patient route', () => {
  const apiDir = new URL('../../server/api/', import.meta.url).pathname
  const files = (dir: string): string[] => readdirSync(dir).flatMap((name) => {
    const full = join(dir, name)
    return statSync(full).isDirectory() ? files(full) : [full]
  })
  // A patient route is any route file that asks the access policy about one patient.
  const onDisk = files(apiDir).flatMap((file) => {
    const source = readFileSync(file, 'utf8')
    const action = source.match(/authorize(?:Patient|Appointment)\((?:[^()]|\([^()]*\))*'([a-z.-]+)'(?:, \w+)?\)/)?.[1]
    const match = relative(apiDir, file).match(/^(.*?)\.(get|post|put|patch|delete)\.ts$/)
    if (!action || !match) return []
    const path = `/api/${match[1]}`.replace(/\/index$/, '').replace(/\[(\w+)\]/g, ':$1')
    return [`${match[2]!.toUpperCase()} ${path} ${action}`]
  })

  it('has one line for each, with the action its source asks for', () => {
    expect(onDisk.length).toBeGreaterThan(15)
    expect(ROUTES.map(([method, path, action]) => `${method} ${path} ${action}`).sort()).toEqual(onDisk.sort())
  })
})
