import type { H3Event } from 'h3'
import { createError, getRouterParam } from 'h3'
import { Op } from 'sequelize'
import type { User as SessionUser } from '#auth-utils'
import type { Role } from '#shared/auth/roles'
import { CareGrant, Patient } from '../../db/models'

/**
 * Who may do what to which patient. Every handler that touches patient data goes through
 * authorizePatient(); the decision itself is the pure table in can(), and it is the whole
 * policy: a patient route asks for one action here and never checks a role itself.
 */
export const PATIENT_ACTIONS = [
  'patient.read', // schedule, diary, injections, results
  'diary.write', // log a diary entry
  'appointment.respond', // confirm or ask for another time
  'appointment.schedule', // book or move an appointment
  'injection.record', // record an injection given
  'regimen.set', // put him on a regimen from a date
  'labs.record', // enter a lab or ECG result
  'circle.read', // see who is in the care circle
  'circle.manage', // invite, change or remove caregivers
  'access-history.read', // the patient's own view of the audit trail
  'triage.work', // work a triage queue item: claim, call, note, disposition, close
  'risk-profile.manage', // read and set the risk profile that raises triage
  'contact.manage', // set his phones, best times to call and preferred contact
  'monitoring.read', // the staff view of his monitoring plan, with results and sources
  'monitoring.manage', // make or change his monitoring plan (clinicians own it)
  'message.read', // read the conversations with the care team and their attachments
  'message.write', // send a message or a file to the care team (or, staff, to him)
  'message.manage', // mark a message entered in error; file an attachment into the record
] as const
export type PatientAction = (typeof PATIENT_ACTIONS)[number]

export interface GrantFlags {
  canLogDiary: boolean
  canManageAppointments: boolean
  canMessage: boolean
}

/** How the person asking relates to the patient record. */
export type Relation =
  | { kind: 'self' }
  | { kind: 'caregiver', grant: GrantFlags | null }
  | { kind: 'staff' }
  | { kind: 'none' }

const STAFF_ALLOWED: Record<'nurse' | 'clinician' | 'admin', readonly PatientAction[]> = {
  nurse: ['patient.read', 'appointment.schedule', 'injection.record', 'regimen.set', 'labs.record', 'circle.read', 'circle.manage', 'triage.work', 'risk-profile.manage', 'contact.manage', 'monitoring.read', 'message.read', 'message.write', 'message.manage'],
  clinician: ['patient.read', 'appointment.schedule', 'injection.record', 'regimen.set', 'labs.record', 'circle.read', 'triage.work', 'risk-profile.manage', 'contact.manage', 'monitoring.read', 'monitoring.manage', 'message.read', 'message.write', 'message.manage'],
  admin: ['patient.read', 'appointment.schedule', 'circle.read', 'circle.manage', 'contact.manage'],
}

const SELF_ALLOWED: readonly PatientAction[] = [
  'patient.read', 'diary.write', 'appointment.respond', 'circle.read', 'circle.manage', 'access-history.read', 'contact.manage', 'message.read', 'message.write',
]

export function can(role: Role, relation: Relation, action: PatientAction): boolean {
  switch (relation.kind) {
    case 'self':
      return role === 'patient' && SELF_ALLOWED.includes(action)
    case 'caregiver':
      if (role !== 'caregiver' || !relation.grant) return false
      if (action === 'patient.read') return true
      if (action === 'diary.write') return relation.grant.canLogDiary
      if (action === 'appointment.respond') return relation.grant.canManageAppointments
      // Reading the conversations comes with the right to take part in them, not with viewing.
      if (action === 'message.read' || action === 'message.write') return relation.grant.canMessage
      return false
    case 'staff':
      return (role === 'nurse' || role === 'clinician' || role === 'admin') && STAFF_ALLOWED[role].includes(action)
    case 'none':
      return false
  }
}

/**
 * The signed-in user, re-read from the database with his session row (one query,
 * server/utils/auth/sessions.ts): a deactivated account, an ended session (signed out, signed
 * out everywhere, password changed) or an idle one stops at once with 401.
 */
export async function requireActiveUser(event: H3Event): Promise<SessionUser> {
  const session = await requireUserSession(event)
  const user = await requireLiveSession(event, session)
  return sessionUserOf(user)
}

export async function requireRole(event: H3Event, roles: readonly Role[]): Promise<SessionUser> {
  const user = await requireActiveUser(event)
  if (!roles.includes(user.role)) throw createError({ statusCode: 403, message: 'errors.forbidden' })
  return user
}

async function relationTo(user: SessionUser, patientId: number): Promise<{ relation: Relation, grant: CareGrant | null }> {
  if (user.role === 'patient') return { relation: user.patientId === patientId ? { kind: 'self' } : { kind: 'none' }, grant: null }
  if (user.role === 'caregiver') {
    const grant = await CareGrant.findOne({ where: { patientId, caregiverUserId: user.id, revokedAt: { [Op.is]: null } } })
    return { relation: { kind: 'caregiver', grant }, grant }
  }
  return { relation: { kind: 'staff' }, grant: null }
}

export interface PatientAccess {
  user: SessionUser
  patient: Patient
  /** The caregiver's grant when a caregiver is acting. */
  grant: CareGrant | null
  relation: Relation['kind']
  /** Whether the same person, in the same relation, may also do another action (what the page may offer). */
  allows: (action: PatientAction) => boolean
}

/**
 * Authenticate, then authorise one action on one patient. A record the user may not see
 * answers 404 (it might as well not exist); one he may see but not change answers 403.
 * Every access by anyone but the patient himself goes to the audit trail: a refusal at once,
 * a granted access when the request has finished, with its outcome (audit.ts).
 */
export async function authorizePatient(event: H3Event, patientId: number, action: PatientAction, signedIn?: SessionUser): Promise<PatientAccess> {
  // A handler that already checked the role passes the user it got, so he is read once.
  const user = signedIn ?? await requireActiveUser(event)
  const id = Number.isSafeInteger(patientId) && patientId > 0 ? patientId : 0
  const patient = id ? await Patient.findByPk(id) : null
  const { relation, grant } = patient ? await relationTo(user, id) : { relation: { kind: 'none' } as Relation, grant: null }
  const audited = relation.kind !== 'self'
  const line = { actor: user, patientId: patient?.id ?? null, action, resource: `${event.method} ${event.path}` }

  if (!patient || !can(user.role, relation, 'patient.read')) {
    if (audited) await recordAudit(event, { ...line, outcome: 'refused-policy' })
    throw createError({ statusCode: 404, message: 'errors.notFound' })
  }
  if (!can(user.role, relation, action)) {
    if (audited) await recordAudit(event, { ...line, outcome: 'refused-policy' })
    throw createError({ statusCode: 403, message: 'errors.forbidden' })
  }
  // Granted: the line is written when the request ends, with what happened (done, refused
  // as invalid, ...): server/plugins/00.audit-outcome.ts.
  if (audited) deferAudit(event, line)
  return { user, patient, grant, relation: relation.kind, allows: other => can(user.role, relation, other) }
}

/** The numeric route parameter, or 0 when it is not one (authorizePatient then answers 404). */
export function idParam(event: H3Event, name = 'id'): number {
  const raw = getRouterParam(event, name) ?? ''
  return /^\d{1,10}$/.test(raw) ? Number(raw) : 0
}
