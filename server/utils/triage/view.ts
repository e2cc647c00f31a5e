import { Op } from 'sequelize'
import { riskProfileOf } from '#shared/triage/risk-profile'
import { daysBetween } from '#shared/schedule/rules'
import type { TriageDetailView, TriageRowView } from '#shared/triage/views'
import { DiaryEntry, Patient, TriageEvent, TriageItem, User } from '../../db/models'

/** A queue row: enough to choose what to open next; the name only ever goes to staff. */
export function triageRow(item: TriageItem, now: Date): TriageRowView {
  const patient = item.patient
  return {
    id: item.id,
    reference: itemReference(item.id),
    patientId: item.patientId,
    patientName: patient?.user?.name ?? '',
    clinicNumber: patient?.clinicNumber ?? '',
    source: item.source,
    level: item.level,
    reasons: item.reasons,
    status: item.status,
    respondBy: item.respondBy?.toISOString() ?? null,
    overdue: item.status !== 'closed' && item.respondBy !== null && item.respondBy.getTime() < now.getTime(),
    escalated: item.escalatedAt !== null,
    assignee: item.assignee ? { id: item.assignee.id, name: item.assignee.name } : null,
    disposition: item.disposition,
    createdAt: item.createdAt.toISOString(),
  }
}

/** The conversation a message's item belongs to: its source key is `message:<threadId>:<messageId>`. */
export function messageThreadOf(item: Pick<TriageItem, 'source' | 'sourceKey'>): number | null {
  if (item.source !== 'message') return null
  const threadId = Number(/^message:(\d+):\d+$/.exec(item.sourceKey)?.[1])
  return Number.isSafeInteger(threadId) && threadId > 0 ? threadId : null
}

/** Everything a nurse needs on the item page: the entry, the timeline and his context. */
export async function triageDetail(item: TriageItem, now: Date): Promise<TriageDetailView> {
  const clock = await scheduleClock(now)
  const [patient, assignee, events, trend, caregivers, openItems, { flareWatch, ...schedule }] = await Promise.all([
    Patient.findByPk(item.patientId, { include: [{ model: User, as: 'user' }], rejectOnEmpty: true }),
    item.assigneeUserId ? User.findByPk(item.assigneeUserId, { attributes: ['id', 'name'] }) : null,
    TriageEvent.findAll({
      where: { itemId: item.id },
      include: [{ model: User, as: 'actor', attributes: ['id', 'name', 'role'] }],
      order: [['at', 'ASC'], ['id', 'ASC']],
    }),
    // The trend, read whole: the item's own entry is nearly always among the last eight.
    DiaryEntry.findAll({
      where: { patientId: item.patientId },
      include: [{ model: User, as: 'enteredBy', attributes: ['id', 'name', 'role'] }],
      order: [['submittedAt', 'DESC'], ['id', 'DESC']],
      limit: 8,
    }),
    caregiverContacts(item.patientId),
    TriageItem.findAll({
      where: { patientId: item.patientId, status: { [Op.ne]: 'closed' }, id: { [Op.ne]: item.id } },
      order: [['createdAt', 'DESC']],
    }),
    computeSchedule(item.patientId, clock),
  ])
  const entry = item.diaryEntryId
    ? trend.find(e => e.id === item.diaryEntryId)
    ?? await DiaryEntry.findByPk(item.diaryEntryId, { include: [{ model: User, as: 'enteredBy', attributes: ['id', 'name', 'role'] }] })
    : null
  return {
    ...triageRow(Object.assign(item, { patient, assignee }), now),
    events: events.map(e => ({
      id: e.id,
      type: e.type,
      note: e.note,
      data: e.data,
      at: e.at.toISOString(),
      actor: e.actor ? { id: e.actor.id, name: e.actor.name, role: e.actor.role } : null,
    })),
    entry: entry ? diaryView(entry, attributionOf(entry.enteredBy!, patient.userId), item) : null,
    noteRead: events.some(e => e.type === 'note-read'),
    answered: item.source === 'message' && item.status !== 'closed' ? !!await itemAnswer(item.id) : false,
    riskProfile: riskProfileOf(patient.riskProfile),
    contact: contactOf(patient),
    caregivers,
    context: {
      dateOfBirth: patient.dateOfBirth,
      flareWatch,
      schedule: {
        regimen: schedule.regimen,
        lastInjection: schedule.lastInjection,
        daysSinceLastInjection: schedule.lastInjection ? daysBetween(schedule.lastInjection.date, clock.today) : null,
        state: schedule.state,
        dueDate: schedule.dueDate,
        daysToDue: schedule.daysToDue,
      },
      trend: trend.map(t => ({ id: t.id, submittedAt: t.submittedAt.toISOString(), level: t.level, hotFlushScore: t.hotFlushScore, worstPain: t.worstPain })),
      openItems: openItems.map(o => ({ id: o.id, reference: itemReference(o.id), level: o.level, status: o.status, source: o.source })),
    },
    messageThreadId: messageThreadOf(item),
  }
}
