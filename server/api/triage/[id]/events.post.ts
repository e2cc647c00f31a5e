import { triageActionSchema } from '../../../../shared/schemas/triage'
import type { TriageEventType } from '../../../../shared/schemas/triage'
import { DiaryEntry, TriageEvent, TriageItem } from '../../../db/models'

/**
 * Records what a nurse or clinician did on an item (one body shape per action). Every
 * action lands in the item's timeline and, through the access policy, the audit trail.
 */
export default defineEventHandler(async (event) => {
  const staff = await requireRole(event, ['nurse', 'clinician'])
  const found = await TriageItem.findByPk(idParam(event) || 0)
  if (!found) throw createError({ statusCode: 404, message: 'errors.notFound' })
  const { user } = await authorizePatient(event, found.patientId, 'triage.work', staff)
  const action = await readValidatedBody(event, parseWith(triageActionSchema))
  const sequelize = await useDb()
  const now = new Date()

  await sequelize.transaction(async (transaction) => {
    const item = await TriageItem.findByPk(found.id, { transaction })
    if (!item) throw createError({ statusCode: 404, message: 'errors.notFound' })
    if (item.status === 'closed' && action.type !== 'note' && action.type !== 'note-read') throw createError({ statusCode: 409, message: 'errors.triageClosed' })
    const log = (type: TriageEventType, data: Record<string, unknown> = {}) =>
      TriageEvent.create({ itemId: item.id, actorUserId: user.id, type, note: 'note' in action ? action.note ?? null : null, data, at: now }, { transaction })
    const startWork = item.status === 'new' || item.status === 'waiting' ? { status: 'in-progress' as const } : {}

    switch (action.type) {
      case 'claim':
        await item.update({ assigneeUserId: user.id, ...startWork }, { transaction })
        await log('claimed')
        break
      case 'note':
        await log('note')
        break
      case 'call':
        await item.update({ ...startWork, assigneeUserId: item.assigneeUserId ?? user.id }, { transaction })
        await log(action.reached ? 'call-reached' : 'call-attempted')
        break
      case 'message':
        await item.update({ ...startWork, assigneeUserId: item.assigneeUserId ?? user.id }, { transaction })
        await log('message-sent')
        break
      case 'waiting':
        await item.update({ status: 'waiting', assigneeUserId: item.assigneeUserId ?? user.id }, { transaction })
        await log('waiting')
        break
      case 'escalate': {
        await item.update({ ...startWork, escalatedAt: item.escalatedAt ?? now }, { transaction })
        await log('escalated', { automatic: false })
        await alertStaff(item, 'triageEscalation', (await getSettings(transaction)).clinicianAlertList, transaction, `manual-${now.getTime()}`)
        break
      }
      case 'disposition':
        await item.update({ disposition: action.disposition, ...startWork }, { transaction })
        await log('disposition-set', { disposition: action.disposition })
        break
      case 'note-read': {
        // Every note is read by a person: the timeline says who read it and when.
        const entry = item.diaryEntryId ? await DiaryEntry.findByPk(item.diaryEntryId, { attributes: ['id', 'noteFlagged'], transaction }) : null
        if (!entry?.noteFlagged) throw createError({ statusCode: 409, message: 'errors.noNoteToRead' })
        await log('note-read')
        break
      }
      case 'close':
        if (!item.disposition) throw createError({ statusCode: 400, message: 'errors.dispositionRequired', data: { fieldErrors: { disposition: ['validation.triage.disposition'] } } })
        await item.update({ status: 'closed', closedAt: now }, { transaction })
        await log('closed', { disposition: item.disposition })
        break
    }
  })
  const item = await TriageItem.findByPk(found.id)
  return triageDetail(item!, now)
})
