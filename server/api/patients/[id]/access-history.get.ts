import { User } from '../../../db/models'
import { pageQuerySchema } from '#shared/audit/schemas'

/**
 * The patient's own view of the audit trail: who (staff or his caregivers) looked at or
 * changed his record, one line per person, per day in the clinic's time zone and per kind
 * (read, change, refused) with a count, newest day first (server/utils/audit/audit-history.ts).
 * His own actions and refusals by the access policy are left out; admins see those in the
 * full trail. A request refused as invalid shows as refused, never as a change.
 */
export default defineEventHandler(async (event) => {
  const { patient } = await authorizePatient(event, idParam(event), 'access-history.read')
  const { page } = await getValidatedQuery(event, parseWith(pageQuerySchema))
  const { timeZone } = await getSettings()
  const { total, groups } = await accessHistory(patient.id, patient.userId, timeZone, page)
  const actorIds = [...new Set(groups.map(g => g.actorUserId).filter((id): id is number => id !== null))]
  const names = new Map((actorIds.length ? await User.findAll({ where: { id: actorIds }, attributes: ['id', 'name'] }) : []).map(u => [u.id, u.name]))
  return {
    total,
    page,
    pageSize: HISTORY_PAGE_SIZE,
    timeZone,
    groups: groups.map(g => ({
      id: `${g.actorUserId ?? 0}-${g.actorRole ?? ''}-${g.day}-${g.kind}`,
      day: g.day,
      kind: g.kind,
      count: g.count,
      firstAt: parseDbDate(g.firstAt).toISOString(),
      lastAt: parseDbDate(g.lastAt).toISOString(),
      actions: g.actions,
      actor: { name: (g.actorUserId !== null ? names.get(g.actorUserId) : null) ?? '', role: g.actorRole },
    })),
  }
})
