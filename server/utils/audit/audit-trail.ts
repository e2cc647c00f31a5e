import { DateTime } from 'luxon'
import { Op } from 'sequelize'
import type { WhereOptions } from 'sequelize'
import type { AuditEvent } from '../../db/models'
import { Patient, User } from '../../db/models'
import type { AuditQuery } from '#shared/audit/schemas'
import type { Role } from '#shared/auth/roles'

export const AUDIT_PAGE_SIZE = 50

/** Newest first; the id breaks ties between lines written in the same millisecond. */
export const AUDIT_ORDER: [string, string][] = [['at', 'DESC'], ['id', 'DESC']]

/** The admin audit page's filters as a query; dates are whole days in the clinic's time zone. */
export function auditWhere(query: AuditQuery, timeZone: string): WhereOptions<AuditEvent> {
  const at: Record<symbol, Date> = {}
  if (query.from) at[Op.gte] = DateTime.fromISO(query.from, { zone: timeZone }).startOf('day').toJSDate()
  if (query.to) at[Op.lt] = DateTime.fromISO(query.to, { zone: timeZone }).plus({ days: 1 }).startOf('day').toJSDate()
  return {
    ...(query.actor ? { actorUserId: query.actor } : {}),
    ...(query.patient ? { patientId: query.patient } : {}),
    ...(query.action ? { action: query.action } : {}),
    ...(query.outcome ? { outcome: query.outcome } : {}),
    ...(query.from || query.to ? { at } : {}),
  }
}

/**
 * Whether a line was a look or a change: a GET request (the policy writes the method at the
 * start of the resource) or a *.read action is a look; anything else a change.
 */
export function auditKind(action: string, resource = ''): 'viewed' | 'changed' {
  const method = resource.match(/^([A-Z]+) \//)?.[1]
  if (method) return method === 'GET' || method === 'HEAD' ? 'viewed' : 'changed'
  return action.endsWith('.read') ? 'viewed' : 'changed'
}

/** Names for the actors and patients of some audit lines (two queries, not one per line). */
export async function auditPeople(events: readonly AuditEvent[]) {
  const actorIds = [...new Set(events.map(e => e.actorUserId).filter((id): id is number => id !== null))]
  const patientIds = [...new Set(events.map(e => e.patientId).filter((id): id is number => id !== null))]
  const [actors, patients] = await Promise.all([
    actorIds.length ? User.findAll({ where: { id: actorIds }, attributes: ['id', 'name', 'email', 'role'] }) : [],
    patientIds.length ? Patient.findAll({ where: { id: patientIds }, include: [{ model: User, as: 'user', attributes: ['id', 'name'] }] }) : [],
  ])
  const actorById = new Map(actors.map(u => [u.id, { id: u.id, name: u.name, email: u.email, role: u.role as Role }]))
  const patientById = new Map(patients.map(p => [p.id, { id: p.id, name: p.user?.name ?? '', clinicNumber: p.clinicNumber }]))
  return {
    actor: (event: AuditEvent) => (event.actorUserId === null ? null : actorById.get(event.actorUserId) ?? null),
    patient: (event: AuditEvent) => (event.patientId === null ? null : patientById.get(event.patientId) ?? null),
  }
}

/**
 * A cell that a spreadsheet would run as a formula (=, +, -, @, tab, carriage return at the
 * start) gets a leading apostrophe, as OWASP's CSV-injection advice suggests.
 */
export function spreadsheetSafe(value: string | number | null): string | number | null {
  return typeof value === 'string' && /^[=+\-@\t\r]/.test(value) ? `'${value}` : value
}
