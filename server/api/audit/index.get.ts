import { AuditEvent } from '../../db/models'
import { auditQuerySchema } from '#shared/audit/schemas'

/**
 * The audit trail for admins, newest first, one page at a time, with filters (person,
 * patient, action, outcome, date range); /api/audit/export gives the same lines as CSV.
 * Reading the trail is itself recorded, after the lines are read.
 */
export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, ['admin'])
  const query = await getValidatedQuery(event, parseWith(auditQuerySchema))
  const { timeZone } = await getSettings()
  const where = auditWhere(query, timeZone)
  const [{ rows, count }, actions] = await Promise.all([
    AuditEvent.findAndCountAll({ where, order: AUDIT_ORDER, limit: AUDIT_PAGE_SIZE, offset: (query.page - 1) * AUDIT_PAGE_SIZE }),
    AuditEvent.findAll({ attributes: ['action'], group: ['action'], order: [['action', 'ASC']] }),
  ])
  const people = await auditPeople(rows)
  await recordAudit(event, { actor: admin, patientId: null, action: 'audit.read', resource: `${event.method} ${event.path}` })
  return {
    total: count,
    page: query.page,
    pageSize: AUDIT_PAGE_SIZE,
    actions: actions.map(a => a.action),
    events: rows.map(e => ({
      id: e.id,
      at: e.at,
      actor: people.actor(e),
      actorRole: e.actorRole,
      patient: people.patient(e),
      action: e.action,
      kind: auditKind(e.action, e.resource),
      resource: e.resource,
      outcome: e.outcome,
      ip: e.ip,
    })),
  }
})
