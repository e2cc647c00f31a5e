import { createError } from 'h3'
import { Op, UniqueConstraintError } from 'sequelize'
import type { Transaction } from 'sequelize'
import { riskProfileOf } from '#shared/triage/risk-profile'
import { localDate } from '#shared/schedule/rules'
import { compareLevels, evaluateTriage } from '#shared/triage/rules'
import type { RightNowItem, TriageLevel, TriageReason, TriageResult } from '#shared/triage/rules'
import { hotFlushScoreFromDiary } from '#shared/diary/scores'
import { emptyDiaryEntry, withDiaryDefaults } from '#shared/diary/schemas'
import type { DiaryEntryInput, DiarySubmission } from '#shared/diary/schemas'
import type { TriageEventType } from '#shared/triage/schemas'
import type { Attribution } from '#shared/common/attribution'
import type { DiaryEntryView } from '#shared/diary/views'
import { DiaryEntry, Patient, TriageEvent, TriageItem, User } from '../../db/models'
import { attributionOf } from '../core/attribution'

/**
 * An entry as the API returns it. enteredBy is attributionOf(the entry's author,
 * patient.userId); the diary shows his name and relation, not his role. Pass the entry's
 * queue item (or null when it opened none) to include the care team's review; leave it out
 * where the review is not wanted.
 */
export function diaryView(entry: DiaryEntry, enteredBy: Attribution, item?: Pick<TriageItem, 'status' | 'disposition' | 'closedAt'> | null): DiaryEntryView {
  const view: DiaryEntryView = {
    id: entry.id,
    patientId: entry.patientId,
    submittedAt: entry.submittedAt.toISOString(),
    complete: entry.complete,
    level: entry.level,
    reasons: entry.reasons,
    respondBy: entry.respondBy?.toISOString() ?? null,
    noteFlagged: entry.noteFlagged,
    flareWatchActive: entry.flareWatchActive,
    rulesVersion: entry.rulesVersion,
    hotFlushScore: entry.hotFlushScore,
    worstPain: entry.worstPain,
    answers: entry.answers,
    enteredBy: { name: enteredBy.name, relation: enteredBy.relation },
  }
  if (item !== undefined) view.review = item ? { status: item.status, disposition: item.disposition, closedAt: item.closedAt?.toISOString() ?? null } : null
  return view
}

/**
 * Works out the triage of an entry against the patient's own recent complete entries (an
 * entry opened by a right-now report alone says nothing about his usual week), his flare
 * watch and his risk profile, with the clinic's response targets. The server's result is
 * the one kept. `entryId` leaves the entry being completed out of its own baseline.
 */
export async function triageNewEntry(patient: Patient, answers: DiaryEntryInput, submittedAt: Date, transaction?: Transaction, entryId?: number): Promise<TriageResult & { flareWatchActive: boolean }> {
  const settings = await getSettings(transaction)
  const previous = await DiaryEntry.findAll({
    where: { patientId: patient.id, complete: true, ...(entryId ? { id: { [Op.ne]: entryId } } : {}) },
    order: [['submittedAt', 'DESC'], ['id', 'DESC']],
    limit: 4,
    transaction,
  })
  const { flareWatch } = await computeSchedule(patient.id, { now: submittedAt, settings, today: localDate(submittedAt, settings.timeZone) }, transaction)
  const context = {
    flareWatchActive: flareWatch.active,
    riskProfile: riskProfileOf(patient.riskProfile),
    baseline: previous.map(p => withDiaryDefaults(p.answers)),
    submittedAt,
    timeZone: settings.timeZone,
    targets: { urgentHours: settings.urgentResponseHours, routineWorkingDays: settings.routineResponseWorkingDays },
  }
  const result = evaluateTriage(answers, context)
  return { ...result, flareWatchActive: flareWatch.active }
}

function scoresOf(answers: DiaryEntryInput) {
  return {
    hotFlushScore: hotFlushScoreFromDiary(answers.hotFlushes.perDay, answers.hotFlushes.worstSeverity),
    worstPain: answers.pain.worst,
  }
}

/** Stores an entry with its triage; the caller owns the transaction (queue items join it). */
export async function storeDiaryEntry(
  input: { patient: Patient, enteredBy: Pick<User, 'id'>, answers: DiaryEntryInput, submittedAt: Date, draftId?: string | null, complete?: boolean },
  transaction: Transaction,
) {
  const triage = await triageNewEntry(input.patient, input.answers, input.submittedAt, transaction)
  const entry = await DiaryEntry.create({
    patientId: input.patient.id,
    enteredByUserId: input.enteredBy.id,
    answers: input.answers,
    level: triage.level,
    reasons: triage.reasons,
    respondBy: triage.respondBy,
    noteFlagged: triage.noteFlagged,
    flareWatchActive: triage.flareWatchActive,
    rulesVersion: triage.rulesVersion,
    ...scoresOf(input.answers),
    submittedAt: input.submittedAt,
    draftId: input.draftId ?? null,
    complete: input.complete ?? true,
  }, { transaction })
  return { entry, triage }
}

function higherLevel(a: TriageLevel, b: TriageLevel): TriageLevel {
  return compareLevels(a, b) >= 0 ? a : b
}

/** The new reasons, and any earlier one the new triage no longer gives (nothing once told is dropped). */
function mergedReasons(earlier: readonly TriageReason[], now: readonly TriageReason[]): TriageReason[] {
  const rules = new Set(now.map(reason => reason.rule))
  return [...now, ...earlier.filter(reason => !rules.has(reason.rule))].sort((a, b) => compareLevels(b.level, a.level))
}

/** The respond-by time of a level that may have gone up: a higher level takes the new time, the same level keeps the sooner. */
function mergedRespondBy(before: { level: TriageLevel, respondBy: Date | null }, after: { level: TriageLevel, respondBy: Date | null }): Date | null {
  const order = compareLevels(after.level, before.level)
  if (order > 0) return after.respondBy
  if (order < 0) return before.respondBy
  if (!before.respondBy || !after.respondBy) return before.respondBy ?? after.respondBy
  return before.respondBy.getTime() <= after.respondBy.getTime() ? before.respondBy : after.respondBy
}

/**
 * Triages an entry again with new answers (more right-now items, or the rest of the diary)
 * and carries the result to its queue item: the level never goes down, no reason is
 * dropped, the item stays the same one and the nurses are not alerted a second time. An
 * item already closed opens again when the new answers bring a reason it did not have,
 * and then (urgent or emergency) the nurses on duty are alerted again: nobody is looking
 * at a closed item. An entry with no item yet opens one (alerting as a new item does).
 */
async function retriageEntry(
  input: { entry: DiaryEntry, patient: Patient, answers: DiaryEntryInput, at: Date, complete: boolean, eventType: TriageEventType },
  transaction: Transaction,
) {
  const { entry } = input
  const triage = await triageNewEntry(input.patient, input.answers, input.at, transaction, entry.id)
  const before = { level: entry.level, respondBy: entry.respondBy }
  const level = higherLevel(entry.level, triage.level)
  const addedRules = triage.reasons.map(reason => reason.rule).filter(rule => !entry.reasons.some(reason => reason.rule === rule))
  await entry.update({
    answers: input.answers,
    level,
    reasons: mergedReasons(entry.reasons, triage.reasons),
    respondBy: mergedRespondBy(before, triage),
    noteFlagged: triage.noteFlagged,
    flareWatchActive: triage.flareWatchActive,
    rulesVersion: triage.rulesVersion,
    ...scoresOf(input.answers),
    complete: input.complete,
  }, { transaction })

  const item = await TriageItem.findOne({ where: { sourceKey: `diary:${entry.id}` }, transaction })
  if (!item) {
    await openTriageItemForEntry(entry, transaction)
    return
  }
  const reopen = item.status === 'closed' && addedRules.length > 0
  await item.update({
    level: higherLevel(item.level, level),
    reasons: mergedReasons(item.reasons, entry.reasons),
    respondBy: mergedRespondBy(item, { level, respondBy: entry.respondBy }),
    ...(reopen ? { status: 'new' as const, closedAt: null } : {}),
  }, { transaction })
  await TriageEvent.create({
    itemId: item.id,
    actorUserId: null,
    type: input.eventType,
    note: null,
    data: { level: item.level, addedRules, reopened: reopen },
    at: input.at,
  }, { transaction })
  if (reopen && alertsNurses(item.level)) {
    await alertStaff(item, 'triageAlert', (await getSettings(transaction)).nursesOnDuty, transaction, `reopened-${input.at.getTime()}`)
  }
}

function withRightNowYes(answers: DiaryEntryInput, items: readonly RightNowItem[]): DiaryEntryInput {
  const rightNow = { ...answers.rightNow }
  for (const item of items) rightNow[item] = true
  return { ...answers, rightNow }
}

function rightNowYes(answers: DiaryEntryInput): RightNowItem[] {
  return (Object.keys(answers.rightNow) as RightNowItem[]).filter(item => answers.rightNow[item])
}

function findDraft(patientId: number, draftId: string, transaction: Transaction) {
  return DiaryEntry.findOne({ where: { patientId, draftId }, transaction })
}

/**
 * A right-now "yes" sent on its own: opens the entry under the draft id (not complete,
 * every other answer "no"), triaged emergency, with its queue item and the alert to the
 * nurses on duty; a later report ORs its items into the same entry. `created` is true
 * when this report opened the entry.
 */
export async function reportRightNow(
  input: { patient: Patient, enteredBy: Pick<User, 'id'>, draftId: string, items: readonly RightNowItem[], at: Date },
  transaction: Transaction,
): Promise<{ entry: DiaryEntry, created: boolean }> {
  const existing = await findDraft(input.patient.id, input.draftId, transaction)
  if (!existing) {
    const answers = withRightNowYes(emptyDiaryEntry(), input.items)
    const { entry } = await storeDiaryEntry({ patient: input.patient, enteredBy: input.enteredBy, answers, submittedAt: input.at, draftId: input.draftId, complete: false }, transaction)
    await openTriageItemForEntry(entry, transaction)
    return { entry, created: true }
  }
  const stored = withDiaryDefaults(existing.answers)
  if (input.items.every(item => stored.rightNow[item])) return { entry: existing, created: false }
  await retriageEntry({ entry: existing, patient: input.patient, answers: withRightNowYes(stored, input.items), at: input.at, complete: existing.complete, eventType: 'right-now-added' }, transaction)
  return { entry: existing, created: false }
}

/**
 * The whole diary. Without a draft id, or with one not seen before: a new entry (created).
 * With the draft id of an entry a right-now report opened: the answers complete it (every
 * right-now "yes" already sent stays yes), triaged again onto the same queue item. With
 * the draft id of a complete entry (a double click, a retry): that entry, unchanged.
 */
export async function submitDiary(
  input: { patient: Patient, enteredBy: Pick<User, 'id'>, submission: DiarySubmission, at: Date },
  transaction: Transaction,
): Promise<{ entry: DiaryEntry, created: boolean }> {
  const { draftId, ...answers } = input.submission
  const existing = draftId ? await findDraft(input.patient.id, draftId, transaction) : null
  if (!existing) {
    const { entry } = await storeDiaryEntry({ patient: input.patient, enteredBy: input.enteredBy, answers, submittedAt: input.at, draftId: draftId ?? null }, transaction)
    await openTriageItemForEntry(entry, transaction)
    return { entry, created: true }
  }
  if (existing.complete) return { entry: existing, created: false }
  const completed = withRightNowYes(answers, rightNowYes(withDiaryDefaults(existing.answers)))
  await retriageEntry({ entry: existing, patient: input.patient, answers: completed, at: input.at, complete: true, eventType: 'diary-completed' }, transaction)
  return { entry: existing, created: false }
}

/** One of his entries with who entered it and the care team's review, or null when it is not his. */
export async function findDiaryEntryView(entryId: number, patient: Patient): Promise<DiaryEntryView | null> {
  const entry = await DiaryEntry.findOne({
    where: { id: entryId, patientId: patient.id },
    include: [
      { model: User, as: 'enteredBy', attributes: ['id', 'name', 'role'] },
      { model: TriageItem, as: 'triageItem', attributes: ['status', 'disposition', 'closedAt'] },
    ],
  })
  if (!entry) return null
  return diaryView(entry, attributionOf(entry.enteredBy!, patient.userId), entry.triageItem ?? null)
}

/** The answer of the diary routes: the entry as stored now. */
export async function diaryEntryReply(entryId: number, patient: Patient): Promise<DiaryEntryView> {
  const view = await findDiaryEntryView(entryId, patient)
  if (!view) throw createError({ statusCode: 404, message: 'errors.notFound' })
  return view
}

/**
 * Runs a change keyed by a draft id in a transaction, once more if another request with
 * the same draft id stored its entry first (the unique key on patient and draft id): the
 * second run finds that entry and joins it instead of storing a second one.
 */
export async function inDraftTransaction<T>(work: (transaction: Transaction) => Promise<T>): Promise<T> {
  const sequelize = await useDb()
  try {
    return await sequelize.transaction(work)
  }
  catch (error) {
    if (!(error instanceof UniqueConstraintError)) throw error
    return sequelize.transaction(work)
  }
}

const WEEK_MS = 7 * 24 * 60 * 60 * 1000

/**
 * Writes a reminder to the outbox for every active patient whose last entry (or, with no
 * entry yet, whose account) is a week old or more: once per week without an entry, in his
 * language. The dedupe key counts the weeks since his last entry, so a second run in the
 * same week sends nothing. Returns how many reminders were queued.
 */
export async function sendDiaryReminders(now: Date): Promise<number> {
  const sequelize = await useDb()
  const patients = await Patient.findAll({ include: [{ model: User, as: 'user', where: { active: true } }] })
  const lastEntries = await DiaryEntry.findAll({
    attributes: ['patientId', [sequelize.fn('MAX', sequelize.col('submitted_at')), 'last']],
    group: ['patientId'],
    raw: true,
  }) as unknown as { patientId: number, last: string }[]
  const lastByPatient = new Map(lastEntries.map(row => [row.patientId, new Date(row.last)]))
  let queued = 0
  for (const patient of patients) {
    const user = patient.user
    if (!user?.passwordHash) continue
    const since = lastByPatient.get(patient.id) ?? patient.createdAt
    const weeks = Math.floor((now.getTime() - since.getTime()) / WEEK_MS)
    if (weeks < 1) continue
    await sequelize.transaction(async (transaction) => {
      const created = await enqueueMail({
        ...mailTo(user),
        template: 'diaryReminder',
        params: { name: user.name },
        linkPath: '/diary/new',
        dedupeKey: `diary-reminder:${patient.id}:${since.toISOString()}:${weeks}`,
      }, transaction)
      if (created) queued++
    })
  }
  return queued
}
