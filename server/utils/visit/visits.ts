import type { H3Event } from 'h3'
import { createError, getRouterParam } from 'h3'
import type { Transaction } from 'sequelize'
import { zonedDateTimeToUtc } from '#shared/schedule/rules'
import { HYPERSENSITIVITY_REASON, windowCheck } from '#shared/visit/rules'
import type { VisitKitView, VisitView } from '#shared/visit/views'
import type { Patient , TriageItem} from '../../db/models'
import { Injection, User, Visit, VisitKit } from '../../db/models'
import type { ScheduleClock } from '../schedule/clock'

/*
 * The injection visit on the server: finding a visit within its patient, the guards between
 * its steps, the view the page gets, and the hypersensitivity alert. The routes under
 * server/api/patients/[id]/visits run the steps; the rules are in shared/visit.
 */

/** The visit of this patient named by the route (404 for another patient's or none). */
export async function findVisit(event: H3Event, patient: Patient, transaction?: Transaction): Promise<Visit> {
  const raw = getRouterParam(event, 'visitId') ?? ''
  const id = /^\d{1,10}$/.test(raw) ? Number(raw) : 0
  const visit = id ? await Visit.findOne({ where: { id, patientId: patient.id }, transaction }) : null
  if (!visit) throw createError({ statusCode: 404, message: 'errors.notFound' })
  return visit
}

/** The kit of this visit named by the route (404 otherwise). */
export async function findKit(event: H3Event, visit: Visit, transaction?: Transaction): Promise<VisitKit> {
  const raw = getRouterParam(event, 'kitId') ?? ''
  const id = /^\d{1,10}$/.test(raw) ? Number(raw) : 0
  const kit = id ? await VisitKit.findOne({ where: { id, visitId: visit.id }, transaction }) : null
  if (!kit) throw createError({ statusCode: 404, message: 'errors.notFound' })
  return kit
}

/** A step that needs the man still in the room: 409 once the visit has ended. */
export function requireHere(visit: Visit) {
  if (visit.status !== 'here') throw createError({ statusCode: 409, message: 'errors.visit.closed' })
}

/** The kit steps need the checks before them: 409 until they are recorded. */
export function requireChecked(visit: Visit) {
  requireHere(visit)
  if (!visit.checkedAt) throw createError({ statusCode: 409, message: 'errors.visit.checksFirst' })
}

/** A clock time ('HH:mm') on the visit's day as an instant in the clinic's zone. */
export function visitInstant(visit: Visit, time: string, clock: ScheduleClock): Date {
  return zonedDateTimeToUtc(visit.visitDate, time, clock.settings.timeZone)
}

/**
 * The known hypersensitivity: an urgent queue item for the visit, with an alert to the
 * nurses on duty (openTriageItem) and to the clinicians on the alert list.
 */
export async function raiseHypersensitivity(visit: Visit, clock: ScheduleClock, transaction: Transaction): Promise<TriageItem | null> {
  const item = await openTriageItem({ source: 'visit', sourceKey: `visit:${visit.id}:hypersensitivity` }, {
    patientId: visit.patientId,
    level: 'urgent',
    reasons: [HYPERSENSITIVITY_REASON],
    respondBy: new Date(clock.now.getTime() + clock.settings.urgentResponseHours * 3600_000),
    at: clock.now,
  }, transaction)
  if (item) await alertStaff(item, 'triageAlert', clock.settings.clinicianAlertList, transaction, 'clinician')
  return item
}

function shapeKit(kit: VisitKit): VisitKitView {
  return {
    id: kit.id,
    regimen: { id: kit.regimenId, name: kit.regimen?.name ?? '' },
    gtin: kit.gtin,
    lotNumber: kit.lotNumber,
    lotExpiresOn: kit.lotExpiresOn,
    powderOk: kit.powderOk,
    diluentOk: kit.diluentOk,
    inspectedAt: kit.createdAt.toISOString(),
    mixedAt: kit.mixedAt?.toISOString() ?? null,
    status: kit.status,
    wasteReason: kit.wasteReason,
  }
}

/** The visit as the page sees it: the checks, where he stands, the kits, the outcome. */
export async function visitView(visit: Visit, patient: Patient, clock: ScheduleClock, transaction?: Transaction): Promise<VisitView> {
  const [user, kits, injection, standing] = await Promise.all([
    User.findByPk(patient.userId, { attributes: ['name'], transaction }),
    VisitKit.findAll({ where: { visitId: visit.id }, include: [{ association: 'regimen', attributes: ['id', 'name'] }], order: [['id', 'ASC']], transaction }),
    visit.injectionId ? Injection.findOne({ where: { id: visit.injectionId, patientId: patient.id }, transaction }) : null,
    computeSchedule(patient.id, { ...clock, today: visit.visitDate }, transaction),
  ])
  // Before the dose: where the visit's day falls against his window. After it, the window
  // the next appointment must fall in.
  const given = visit.status === 'given' && injection
  return {
    id: visit.id,
    patient: { id: patient.id, name: user?.name ?? '', clinicNumber: patient.clinicNumber, dateOfBirth: patient.dateOfBirth },
    appointmentId: visit.appointmentId,
    visitDate: visit.visitDate,
    status: visit.status,
    openedAt: visit.createdAt.toISOString(),
    checks: visit.checkedAt
      ? { at: visit.checkedAt.toISOString(), hypersensitivity: Boolean(visit.hypersensitivity), rightNow: visit.rightNow ?? [], windowReason: visit.windowReason }
      : null,
    window: visit.windowCheck ?? windowCheck(standing, visit.visitDate),
    regimen: standing.regimen ? { id: standing.regimen.id, name: standing.regimen.name, intervalDays: standing.regimen.intervalDays } : null,
    lastInjection: standing.lastInjection ? { date: standing.lastInjection.date, site: standing.lastInjection.site } : null,
    suggestedSite: standing.suggestedSite,
    mixLimitMinutes: clock.settings.mixToInjectMinutes,
    kits: kits.map(shapeKit),
    injection: injection ? { id: injection.id, givenAt: injection.givenAt.toISOString(), site: injection.site, lotNumber: injection.lotNumber } : null,
    mixGapMinutes: visit.mixGapMinutes,
    notGiven: visit.notGivenReason ? { reason: visit.notGivenReason, note: visit.notGivenNote } : null,
    observationNote: visit.observationNote,
    nextAppointmentId: visit.nextAppointmentId,
    nextWindow: given && standing.windowOpens && standing.windowCloses && standing.dueDate
      ? { opens: standing.windowOpens, closes: standing.windowCloses, dueDate: standing.dueDate }
      : null,
    triageItemId: visit.triageItemId,
  }
}

/** The last day a kit may be used is its expiry date: from the day after, it is expired. */
export function kitExpired(expiresOn: string, today: string): boolean {
  return expiresOn < today
}
