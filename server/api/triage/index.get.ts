import { literal, Op } from 'sequelize'
import type { WhereOptions } from 'sequelize'
import { LEVELS } from '#shared/triage/rules'
import { triageQuerySchema } from '#shared/triage/schemas'
import { Patient, TriageItem, User } from '../../db/models'

const LEVEL_RANK = literal(`CASE "TriageItem"."level" WHEN 'emergency' THEN 0 WHEN 'urgent' THEN 1 WHEN 'routine' THEN 2 ELSE 3 END`)

/**
 * The triage queue (nurses and clinicians): highest level first, then the most overdue or
 * closest respond-by time; filters by level, status (or open and escalated), assignee and
 * patient; counts per level.
 */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ['nurse', 'clinician'])
  const query = await getValidatedQuery(event, parseWith(triageQuerySchema))
  const now = new Date()

  const where: WhereOptions = {}
  if (query.status === 'open') Object.assign(where, { status: { [Op.ne]: 'closed' } })
  else if (query.status === 'escalated') Object.assign(where, { status: { [Op.ne]: 'closed' }, escalatedAt: { [Op.ne]: null } })
  else Object.assign(where, { status: query.status })
  if (query.assignee === 'me') Object.assign(where, { assigneeUserId: user.id })
  if (query.assignee === 'nobody') Object.assign(where, { assigneeUserId: { [Op.is]: null } })
  if (query.q) {
    const contains = textContains(query.q)
    Object.assign(where, { [Op.or]: [{ '$patient.clinic_number$': contains }, { '$patient.user.name$': contains }] })
  }

  const include = [{ model: Patient, as: 'patient', required: true, include: [{ model: User, as: 'user', attributes: ['id', 'name'] }] }]
  // Counting needs the patient join only to search by name or clinic number.
  const countInclude = query.q ? include : []
  const [items, total, counts] = await Promise.all([
    TriageItem.findAll({
      where: { ...where, ...(query.level ? { level: query.level } : {}) },
      include: [...include, { model: User, as: 'assignee', attributes: ['id', 'name'] }],
      order: [[LEVEL_RANK, 'ASC'], [literal('"TriageItem"."respond_by" IS NULL'), 'ASC'], ['respondBy', 'ASC'], ['id', 'ASC']],
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
      subQuery: false,
    }),
    TriageItem.count({ where: { ...where, ...(query.level ? { level: query.level } : {}) }, include: countInclude }),
    TriageItem.count({ where, include: countInclude, group: ['level'] }) as unknown as Promise<{ level: string, count: number }[]>,
  ])
  // One line per patient on the page shown (audit.ts recordListAudit).
  await recordListAudit(event, { actor: user, action: 'triage-queue.read', resource: `${event.method} ${event.path}` }, items.map(item => item.patientId))
  const countByLevel = Object.fromEntries(LEVELS.filter(l => l !== 'none').map(l => [l, counts.find(c => c.level === l)?.count ?? 0]))
  return { page: query.page, pageSize: query.pageSize, total, counts: countByLevel, items: items.map(item => triageRow(item, now)) }
})
