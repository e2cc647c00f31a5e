import { Op } from 'sequelize'
import { AuditEvent } from '../../../db/models'
import { pageQuerySchema } from '../../../../shared/schemas/circle'

/**
 * The patient's own view of the audit trail: who (staff or his caregivers) opened or
 * changed his record, and when, newest first. His own actions and refused attempts are
 * left out; admins see those in the full trail.
 */
export default defineEventHandler(async (event) => {
  const { patient } = await authorizePatient(event, idParam(event), 'access-history.read')
  const { page } = await getValidatedQuery(event, parseWith(pageQuerySchema))
  const { rows, count } = await AuditEvent.findAndCountAll({
    where: { patientId: patient.id, outcome: 'allowed', actorUserId: { [Op.ne]: patient.userId } },
    order: [['at', 'DESC'], ['id', 'DESC']],
    limit: AUDIT_PAGE_SIZE,
    offset: (page - 1) * AUDIT_PAGE_SIZE,
  })
  const people = await auditPeople(rows)
  return {
    total: count,
    page,
    pageSize: AUDIT_PAGE_SIZE,
    events: rows.map((e) => {
      const actor = people.actor(e)
      return { id: e.id, at: e.at, actor: { name: actor?.name ?? '', role: e.actorRole }, action: e.action, kind: auditKind(e.action, e.resource) }
    }),
  }
})
