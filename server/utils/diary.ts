import type { Transaction } from 'sequelize'
import { localDate } from '../../shared/clinical/schedule'
import { evaluateTriage } from '../../shared/clinical/triage'
import type { TriageResult } from '../../shared/clinical/triage'
import { hotFlushScoreFromDiary } from '../../shared/clinical/scores'
import type { DiaryEntryInput } from '../../shared/schemas/diary'
import type { DiaryEntryView, EnteredBy } from '../../shared/types/diary'
import { DiaryEntry, Patient, User } from '../db/models'

export function enteredByOf(user: Pick<User, 'id' | 'name' | 'role'>, patient: Pick<Patient, 'userId'>): EnteredBy {
  const relation = user.id === patient.userId ? 'self' : user.role === 'caregiver' ? 'caregiver' : 'staff'
  return { name: user.name, relation }
}

export function diaryView(entry: DiaryEntry, enteredBy: EnteredBy): DiaryEntryView {
  return {
    id: entry.id,
    patientId: entry.patientId,
    submittedAt: entry.submittedAt.toISOString(),
    level: entry.level,
    reasons: entry.reasons,
    respondBy: entry.respondBy?.toISOString() ?? null,
    noteFlagged: entry.noteFlagged,
    flareWatchActive: entry.flareWatchActive,
    hotFlushScore: entry.hotFlushScore,
    worstPain: entry.worstPain,
    answers: entry.answers,
    enteredBy,
  }
}

/**
 * Works out the triage of a new entry against the patient's own recent entries and his
 * flare watch, with the clinic's response targets. The server's result is the one kept.
 */
export async function triageNewEntry(patient: Patient, answers: DiaryEntryInput, submittedAt: Date, transaction?: Transaction): Promise<TriageResult & { flareWatchActive: boolean }> {
  const settings = await getSettings()
  const previous = await DiaryEntry.findAll({
    where: { patientId: patient.id },
    order: [['submittedAt', 'DESC'], ['id', 'DESC']],
    limit: 4,
    transaction,
  })
  const { flareWatch } = await computeSchedule(patient.id, { now: submittedAt, settings, today: localDate(submittedAt, settings.timeZone) }, transaction)
  const result = evaluateTriage(answers, {
    flareWatchActive: flareWatch.active,
    baseline: previous.map(p => p.answers),
    submittedAt,
    timeZone: settings.timeZone,
    targets: { urgentHours: settings.urgentResponseHours, routineWorkingDays: settings.routineResponseWorkingDays },
  })
  return { ...result, flareWatchActive: flareWatch.active }
}

/** Stores an entry with its triage; the caller owns the transaction (queue items join it). */
export async function storeDiaryEntry(
  input: { patient: Patient, enteredBy: Pick<User, 'id'>, answers: DiaryEntryInput, submittedAt: Date },
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
    hotFlushScore: hotFlushScoreFromDiary(input.answers.hotFlushes.perDay, input.answers.hotFlushes.worstSeverity),
    worstPain: input.answers.pain.worst,
    submittedAt: input.submittedAt,
  }, { transaction })
  return { entry, triage }
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
    const user = (patient as Patient & { user: User }).user
    if (!user.passwordHash) continue
    const since = lastByPatient.get(patient.id) ?? patient.createdAt
    const weeks = Math.floor((now.getTime() - since.getTime()) / WEEK_MS)
    if (weeks < 1) continue
    await sequelize.transaction(async (transaction) => {
      const created = await enqueueMail({
        to: user.email,
        template: 'diaryReminder',
        language: user.language,
        params: { name: user.name },
        linkPath: '/diary/new',
        dedupeKey: `diary-reminder:${patient.id}:${since.toISOString()}:${weeks}`,
      }, transaction)
      if (created) queued++
    })
  }
  return queued
}
