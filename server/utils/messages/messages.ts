import { createError } from 'h3'
import { Op } from 'sequelize'
import type { Transaction } from 'sequelize'
import type { User as SessionUser } from '#auth-utils'
import { isStaff } from '#shared/auth/roles'
import type { Role } from '#shared/auth/roles'
import { respondBy, TRIAGE_SOURCES } from '#shared/triage/rules'
import type { TriageReason } from '#shared/triage/rules'
import type { SendMessageInput } from '#shared/messages/schemas'
import type { AttachmentView, MessageAuthor, MessagesView, MessageView, ThreadView } from '#shared/messages/views'
import type { Patient } from '../../db/models'
import { Attachment, CareGrant, Message, MessageRead, MessageThread, TriageEvent, TriageItem, User } from '../../db/models'
import type { PatientAccess } from '../auth/access'
import { attributionOf } from '../core/attribution'

/** The reason on a message's queue item: someone in the patient's circle wrote to the care team. */
export const MESSAGE_REASON: TriageReason = {
  rule: 'message-from-circle',
  level: 'routine',
  reasonKey: 'triage.queue.messageReason',
  instructionKey: 'triage.queue.messageInstruction',
  source: TRIAGE_SOURCES.message,
}

export function attachmentView(attachment: Attachment): AttachmentView {
  return {
    id: attachment.id,
    kind: attachment.kind,
    mime: attachment.mime,
    fileName: attachment.fileName,
    byteSize: attachment.byteSize,
    width: attachment.width,
    height: attachment.height,
    pages: attachment.pages,
    labResultId: attachment.labResultId,
    url: `/api/attachments/${attachment.id}`,
  }
}

function authorOf(user: Pick<User, 'id' | 'name' | 'role'> | undefined, patientUserId: number): MessageAuthor {
  const attribution = user ? attributionOf(user, patientUserId) : { name: '', relation: 'staff' as const }
  return { ...attribution, onBehalf: attribution.relation !== 'self' }
}

/** Whether a message came from the patient's circle (himself or a caregiver), not the care team. */
export function fromCircle(role: Role): boolean {
  return !isStaff(role)
}

/**
 * Every thread of one patient as the person asking may see it: staff see every message,
 * those entered in error marked, and who in the circle read each staff message; the
 * patient's circle never sees a message entered in error (a thread left with none is not
 * shown). Unread counts are the asker's own; for staff, a circle message stays unread until
 * someone of the care team has read it (the team shares one inbox).
 */
export async function messagesViewOf(access: PatientAccess): Promise<MessagesView> {
  const { patient, user } = access
  const staff = isStaff(user.role)
  const threads = await MessageThread.findAll({
    where: { patientId: patient.id },
    include: [
      { model: User, as: 'startedBy', attributes: ['id', 'name', 'role'] },
      {
        model: Message,
        as: 'messages',
        include: [
          { model: User, as: 'author', attributes: ['id', 'name', 'role'] },
          { model: User, as: 'enteredInErrorBy', attributes: ['id', 'name', 'role'] },
          { model: Attachment, as: 'attachments' },
          { model: MessageRead, as: 'reads', include: [{ model: User, as: 'user', attributes: ['id', 'name', 'role'] }] },
        ],
      },
    ],
    order: [['lastMessageAt', 'DESC'], ['id', 'DESC'], [{ model: Message, as: 'messages' }, 'createdAt', 'ASC'], [{ model: Message, as: 'messages' }, 'id', 'ASC']],
  })

  const shown: ThreadView[] = []
  for (const thread of threads) {
    const messages = (thread.messages ?? []).filter(message => staff || !message.enteredInErrorAt)
    if (!messages.length) continue
    const views = messages.map((message): MessageView => {
      const author = message.author!
      const mine = message.authorUserId === user.id
      const reads = message.reads ?? []
      const teamInbox = staff && fromCircle(author.role as Role)
      const read = mine || (teamInbox ? reads.some(r => r.user && isStaff(r.user.role)) : reads.some(r => r.userId === user.id))
      const view: MessageView = {
        id: message.id,
        threadId: thread.id,
        body: message.body,
        sentAt: message.createdAt.toISOString(),
        author: authorOf(author, patient.userId),
        mine,
        read,
        attachments: (message.attachments ?? []).sort((a, b) => a.id - b.id).map(attachmentView),
      }
      if (staff) {
        view.enteredInError = message.enteredInErrorAt
          ? { at: message.enteredInErrorAt.toISOString(), by: message.enteredInErrorBy?.name ?? '', reason: message.enteredInErrorReason ?? '' }
          : null
        if (isStaff(author.role as Role)) {
          view.readBy = reads.filter(r => r.user && !isStaff(r.user.role)).sort((a, b) => a.readAt.getTime() - b.readAt.getTime())
            .map(r => ({ name: r.user!.name, relation: attributionOf(r.user!, patient.userId).relation, readAt: r.readAt.toISOString() }))
        }
      }
      return view
    })
    shown.push({
      id: thread.id,
      subject: thread.subject,
      startedBy: authorOf(thread.startedBy, patient.userId),
      startedAt: thread.createdAt.toISOString(),
      lastMessageAt: thread.lastMessageAt.toISOString(),
      unread: views.filter(v => !v.read && !v.enteredInError).length,
      messages: views,
    })
  }
  return {
    threads: shown,
    unread: shown.reduce((sum, thread) => sum + thread.unread, 0),
    can: { write: access.allows('message.write'), manage: access.allows('message.manage') },
  }
}

/**
 * The files a message carries: each must be his own upload for this patient, not yet sent
 * with another message. They join the message in the caller's transaction.
 */
async function attachFiles(ids: number[], message: Message, uploader: SessionUser, transaction: Transaction) {
  if (!ids.length) return
  const [changed] = await Attachment.update({ messageId: message.id }, {
    where: { id: ids, patientId: message.patientId, uploadedByUserId: uploader.id, messageId: { [Op.is]: null } },
    transaction,
  })
  if (changed !== ids.length) throw fieldError('attachmentIds', 'validation.messages.attachment')
}

/**
 * A message from the patient's circle opens a routine queue item of its own kind with the
 * clinic's routine response target, or joins the thread's item while it is open (an event
 * on it). Returns the item the message belongs to.
 */
async function queueCircleMessage(thread: MessageThread, message: Message, at: Date, transaction: Transaction): Promise<TriageItem> {
  const open = await TriageItem.findOne({
    where: { source: 'message', patientId: thread.patientId, sourceKey: { [Op.like]: `message:${thread.id}:%` }, status: { [Op.ne]: 'closed' } },
    order: [['id', 'DESC']],
    transaction,
  })
  if (open) {
    await TriageEvent.create({ itemId: open.id, actorUserId: null, type: 'message-received', note: null, data: { messageId: message.id }, at }, { transaction })
    return open
  }
  const settings = await getSettings(transaction)
  const targets = { urgentHours: settings.urgentResponseHours, routineWorkingDays: settings.routineResponseWorkingDays }
  const item = await openTriageItem({ source: 'message', sourceKey: `message:${thread.id}:${message.id}` }, {
    patientId: thread.patientId,
    level: 'routine',
    reasons: [MESSAGE_REASON],
    respondBy: respondBy('routine', at, targets, settings.timeZone),
    at,
  }, transaction)
  return item!
}

/** A staff answer in a thread with an open queue item is recorded on the item (the nurse answered). */
async function recordStaffAnswer(thread: MessageThread, message: Message, author: SessionUser, at: Date, transaction: Transaction) {
  const open = await TriageItem.findOne({
    where: { source: 'message', patientId: thread.patientId, sourceKey: { [Op.like]: `message:${thread.id}:%` }, status: { [Op.ne]: 'closed' } },
    transaction,
  })
  if (open) await TriageEvent.create({ itemId: open.id, actorUserId: author.id, type: 'message-sent', note: null, data: { messageId: message.id }, at }, { transaction })
}

/**
 * Who is told of a new message, by e-mail with no content and no patient name: from the
 * circle, the nurses on duty (with the item's reference); from staff, the patient and every
 * caregiver allowed to message, each in his language.
 */
async function announceMessage(patient: Patient, message: Message, author: SessionUser, item: TriageItem | null, transaction: Transaction) {
  if (item) {
    const settings = await getSettings(transaction)
    const addresses = settings.nursesOnDuty.map(a => a.toLowerCase())
    const staff = addresses.length ? await User.findAll({ where: { email: addresses, active: true }, transaction }) : []
    for (const nurse of staff.filter(s => s.id !== author.id)) {
      await enqueueMail({
        ...mailTo(nurse),
        template: 'messageForCareTeam',
        params: { reference: itemReference(item.id) },
        linkPath: `/staff/triage/${item.id}`,
        dedupeKey: `message:${message.id}:${nurse.email}`,
      }, transaction)
    }
    return
  }
  const owner = await User.findByPk(patient.userId, { transaction })
  const grants = await CareGrant.findAll({
    where: { patientId: patient.id, revokedAt: { [Op.is]: null }, canMessage: true },
    include: [{ model: User, as: 'caregiver' }],
    transaction,
  })
  const people = [owner, ...grants.map(g => g.caregiver)].filter((u): u is User => !!u && u.active && u.id !== author.id)
  for (const person of people) {
    await enqueueMail({
      ...mailTo(person),
      template: 'messageForCircle',
      params: { name: person.name },
      linkPath: '/messages',
      dedupeKey: `message:${message.id}:${person.email}`,
    }, transaction)
  }
}

/**
 * Stores a message (a new thread when it names a subject), its files, its queue item (from
 * the circle) and its e-mails in one transaction. The same requestId again returns the first
 * message with nothing written (`created` false).
 */
export async function sendMessage(access: PatientAccess, input: SendMessageInput, at: Date, transaction: Transaction): Promise<{ message: Message, created: boolean }> {
  const { patient, user } = access
  const first = await Message.findOne({ where: { patientId: patient.id, requestId: input.requestId }, transaction })
  if (first) return { message: first, created: false }
  let thread: MessageThread | null
  if (input.threadId !== undefined) {
    thread = await MessageThread.findOne({ where: { id: input.threadId, patientId: patient.id }, transaction })
    // The circle cannot write into a thread it cannot see (every message in it entered in error).
    if (thread && fromCircle(user.role) && !await Message.count({ where: { threadId: thread.id, enteredInErrorAt: { [Op.is]: null } }, transaction })) thread = null
    if (!thread) throw createError({ statusCode: 404, message: 'errors.notFound' })
    await thread.update({ lastMessageAt: at }, { transaction })
  }
  else {
    thread = await MessageThread.create({ patientId: patient.id, subject: input.subject!, startedByUserId: user.id, lastMessageAt: at }, { transaction })
  }
  const message = await Message.create({
    threadId: thread.id,
    patientId: patient.id,
    authorUserId: user.id,
    body: input.body,
    enteredInErrorAt: null,
    enteredInErrorByUserId: null,
    enteredInErrorReason: null,
    requestId: input.requestId,
    createdAt: at,
    updatedAt: at,
  }, { transaction })
  await attachFiles(input.attachmentIds, message, user, transaction)
  // The writer has read his own message.
  await MessageRead.create({ messageId: message.id, userId: user.id, readAt: at }, { transaction })
  let item: TriageItem | null = null
  if (fromCircle(user.role)) item = await queueCircleMessage(thread, message, at, transaction)
  else await recordStaffAnswer(thread, message, user, at, transaction)
  await announceMessage(patient, message, user, item, transaction)
  return { message, created: true }
}

/** The reply to a sent message: it as the sender now sees it. */
export async function sentMessageView(access: PatientAccess, messageId: number): Promise<MessageView> {
  const view = await messagesViewOf(access)
  const found = view.threads.flatMap(t => t.messages).find(m => m.id === messageId)
  if (!found) throw createError({ statusCode: 404, message: 'errors.notFound' })
  return found
}

/**
 * Marks every message in one thread as read by him (those he may see and has not read).
 * Returns how many were marked.
 */
export async function markThreadRead(access: PatientAccess, threadId: number, at: Date, transaction: Transaction): Promise<number> {
  const { patient, user } = access
  const thread = await MessageThread.findOne({ where: { id: threadId, patientId: patient.id }, transaction })
  if (!thread) throw createError({ statusCode: 404, message: 'errors.notFound' })
  const messages = await Message.findAll({
    where: { threadId: thread.id, ...(isStaff(user.role) ? {} : { enteredInErrorAt: { [Op.is]: null } }) },
    include: [{ model: MessageRead, as: 'reads', where: { userId: user.id }, required: false }],
    transaction,
  })
  const unread = messages.filter(m => !(m.reads ?? []).length)
  if (fromCircle(user.role) && messages.length === 0) throw createError({ statusCode: 404, message: 'errors.notFound' })
  if (unread.length) await MessageRead.bulkCreate(unread.map(m => ({ messageId: m.id, userId: user.id, readAt: at })), { transaction, ignoreDuplicates: true })
  return unread.length
}

/**
 * Unread messages for the header: for the patient and his caregivers (allowed to message),
 * messages on those records not written by him and not read by him, entered-in-error ones
 * left out; for nurses and clinicians, messages from any patient's circle nobody of the care
 * team has read; for admins none.
 */
export async function unreadCountFor(user: SessionUser): Promise<number> {
  const sequelize = await useDb()
  const staffRoles = ['nurse', 'clinician', 'admin']
  if (user.role === 'nurse' || user.role === 'clinician') {
    const [rows] = await sequelize.query(`
      SELECT COUNT(*) AS n FROM messages m JOIN users a ON a.id = m.author_user_id
      WHERE a.role NOT IN (:staffRoles) AND m.entered_in_error_at IS NULL
        AND NOT EXISTS (SELECT 1 FROM message_reads r JOIN users u ON u.id = r.user_id WHERE r.message_id = m.id AND u.role IN (:staffRoles))`,
    { replacements: { staffRoles } })
    return Number((rows as { n: number }[])[0]?.n ?? 0)
  }
  let patientIds: number[] = []
  if (user.role === 'patient' && user.patientId) patientIds = [user.patientId]
  if (user.role === 'caregiver') {
    const grants = await CareGrant.findAll({ where: { caregiverUserId: user.id, revokedAt: { [Op.is]: null }, canMessage: true }, attributes: ['patientId'] })
    patientIds = grants.map(g => g.patientId)
  }
  if (!patientIds.length) return 0
  const [rows] = await sequelize.query(`
    SELECT COUNT(*) AS n FROM messages m
    WHERE m.patient_id IN (:patientIds) AND m.author_user_id <> :userId AND m.entered_in_error_at IS NULL
      AND NOT EXISTS (SELECT 1 FROM message_reads r WHERE r.message_id = m.id AND r.user_id = :userId)`,
  { replacements: { patientIds, userId: user.id } })
  return Number((rows as { n: number }[])[0]?.n ?? 0)
}

/**
 * The staff answer that lets a message item close without an outcome: the latest message a
 * nurse or clinician sent in the thread while the item was open (recorded on the item as a
 * 'message-sent' event with its message), still standing (not entered in error). Null: none.
 */
export async function itemAnswer(itemId: number, transaction?: Transaction): Promise<{ messageId: number } | null> {
  const sent = await TriageEvent.findAll({ where: { itemId, type: 'message-sent' }, attributes: ['data'], transaction })
  const ids = sent.map(e => Number(e.data?.messageId)).filter(id => Number.isInteger(id) && id > 0)
  if (!ids.length) return null
  const answer = await Message.findOne({ where: { id: ids, enteredInErrorAt: { [Op.is]: null } }, order: [['id', 'DESC']], attributes: ['id'], transaction })
  return answer ? { messageId: answer.id } : null
}
