import { triageActionSchema } from '#shared/triage/schemas'
import type { TriageEventType } from '#shared/triage/schemas'
import { Op } from 'sequelize'
import { DiaryEntry, TriageEvent, TriageItem } from '../../../db/models'

/**
 * Records what a nurse or clinician did on an item (one body shape per action). Every
 * action lands in the item's timeline and, through the access policy, the audit trail.
 * A change of the item is one conditional UPDATE (… WHERE status != 'closed') inside the
 * transaction: of two nurses closing one item at once, the second changes nothing and
 * gets 409 (errors.triageClosed), even if another process wrote in between. A claim names
 * the assignee the nurse saw (`from`): of two nurses taking one item at once, the second
 * gets 409 (errors.triageTakenMeanwhile) instead of silently taking it from the first.
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
    type ItemChange = Partial<Pick<TriageItem, 'status' | 'assigneeUserId' | 'escalatedAt' | 'disposition' | 'closedAt'>>
    const change = async (values: ItemChange, where: Record<string, unknown> = {}, lost = 'errors.triageClosed') => {
      const [changed] = await TriageItem.update(values, { where: { id: item.id, status: { [Op.ne]: 'closed' }, ...where }, transaction })
      if (changed !== 1) throw createError({ statusCode: 409, message: lost })
      item.set(values)
    }
    const startWork = item.status === 'new' || item.status === 'waiting' ? { status: 'in-progress' as const } : {}

    switch (action.type) {
      case 'claim':
        await change({ assigneeUserId: user.id, ...startWork }, action.from === undefined ? {} : { assigneeUserId: action.from }, 'errors.triageTakenMeanwhile')
        await log('claimed')
        break
      case 'note':
        await log('note')
        break
      case 'call':
        await change({ ...startWork, assigneeUserId: item.assigneeUserId ?? user.id })
        await log(action.reached ? 'call-reached' : 'call-attempted')
        break
      case 'message':
        await change({ ...startWork, assigneeUserId: item.assigneeUserId ?? user.id })
        await log('message-sent')
        break
      case 'waiting':
        await change({ status: 'waiting', assigneeUserId: item.assigneeUserId ?? user.id })
        await log('waiting')
        break
      case 'escalate': {
        await change({ ...startWork, escalatedAt: item.escalatedAt ?? now })
        await log('escalated', { automatic: false })
        await alertStaff(item, 'triageEscalation', (await getSettings(transaction)).clinicianAlertList, transaction, `manual-${now.getTime()}`)
        break
      }
      case 'disposition':
        await change({ disposition: action.disposition, ...startWork })
        await log('disposition-set', { disposition: action.disposition })
        break
      case 'note-read': {
        // Every note is read by a person: the timeline says who read it and when.
        const entry = item.diaryEntryId ? await DiaryEntry.findByPk(item.diaryEntryId, { attributes: ['id', 'noteFlagged'], transaction }) : null
        if (!entry?.noteFlagged) throw createError({ statusCode: 409, message: 'errors.noNoteToRead' })
        await log('note-read')
        break
      }
      case 'close': {
        // Closing needs an outcome; a message item may close with the answer sent instead.
        if (item.disposition) {
          await change({ status: 'closed', closedAt: now }, { disposition: { [Op.ne]: null } })
          await log('closed', { disposition: item.disposition })
          break
        }
        if (item.source !== 'message') throw fieldError('disposition', 'validation.triage.disposition', 400, 'errors.dispositionRequired')
        const answer = await itemAnswer(item.id, transaction)
        if (!answer) throw fieldError('disposition', 'validation.triage.dispositionOrAnswer', 400, 'errors.answerOrDispositionRequired')
        await change({ status: 'closed', closedAt: now })
        await log('closed', { answeredBy: answer.messageId })
        break
      }
    }
  })
  const item = await TriageItem.findByPk(found.id)
  return triageDetail(item!, now)
})
