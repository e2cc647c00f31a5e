import { stringify } from 'csv-stringify/sync'
import { AuditEvent } from '../../db/models'
import { auditQuerySchema } from '#shared/audit/schemas'
import { localDate } from '#shared/schedule/rules'

const COLUMNS = ['id', 'at', 'actor_user_id', 'actor_name', 'actor_email', 'actor_role', 'patient_id', 'patient_clinic_number', 'patient_name', 'action', 'resource', 'outcome', 'ip']

/**
 * Every audit line matching the admin page's filters as a CSV file (csv-stringify), one row
 * per event with a header row, newest first. The download itself is recorded afterwards.
 */
export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, ['admin'])
  const query = await getValidatedQuery(event, parseWith(auditQuerySchema))
  const { timeZone } = await getSettings()
  const events = await AuditEvent.findAll({ where: auditWhere(query, timeZone), order: AUDIT_ORDER })
  const people = await auditPeople(events)
  const csv = stringify(events.map((e) => {
    const actor = people.actor(e)
    const patient = people.patient(e)
    return [e.id, e.at.toISOString(), e.actorUserId, actor?.name ?? null, actor?.email ?? null, e.actorRole, e.patientId, patient?.clinicNumber ?? null, patient?.name ?? null, e.action, e.resource, e.outcome, e.ip]
      .map(spreadsheetSafe)
  }), { header: true, columns: COLUMNS })
  await recordAudit(event, { actor: admin, patientId: null, action: 'audit.export', resource: `${event.method} ${event.path}` })
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  // Named with the clinic's date, the day its staff see on every page, not the UTC one.
  setResponseHeader(event, 'content-disposition', `attachment; filename="tidewell-audit-trail-${localDate(requestNow(event), timeZone)}.csv"`)
  return csv
})
