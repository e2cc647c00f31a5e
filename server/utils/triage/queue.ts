import { Op } from 'sequelize'
import type { Transaction } from 'sequelize'
import type { TriageLevel, TriageReason } from '#shared/triage/rules'
import type { TriageSource } from '#shared/triage/schemas'
import type { DiaryEntry } from '../../db/models'
import { Patient, TriageEvent, TriageItem, User } from '../../db/models'

/** Levels that reach the queue, and those that also alert the nurses on duty by e-mail. */
const QUEUED: readonly TriageLevel[] = ['emergency', 'urgent', 'routine']
const ALERTED: readonly TriageLevel[] = ['emergency', 'urgent']

export function alertsNurses(level: TriageLevel): boolean {
  return ALERTED.includes(level)
}

/** A short reference that says nothing about the patient, for e-mails and phone calls. */
export function itemReference(id: number): string {
  return `TW-${String(id).padStart(6, '0')}`
}

/** Staff e-mail addresses that are real, active accounts (and their language). */
async function recipients(addresses: string[], transaction: Transaction) {
  if (!addresses.length) return []
  const users = await User.findAll({ where: { email: addresses.map(a => a.toLowerCase()), active: true }, transaction })
  const byEmail = new Map(users.map(u => [u.email, u]))
  return addresses.map(a => ({ email: a.toLowerCase(), language: byEmail.get(a.toLowerCase())?.language ?? 'en' as const }))
}

/**
 * Alert e-mail for an item: the level, a reference and a link, and nothing clinical and
 * no name (e-mail is not a safe place for health data). Deduplicated per item and address.
 */
export async function alertStaff(item: TriageItem, template: 'triageAlert' | 'triageEscalation', addresses: string[], transaction: Transaction, occasion = 'first') {
  for (const to of await recipients(addresses, transaction)) {
    await enqueueMail({
      ...mailTo(to),
      template,
      params: { reference: itemReference(item.id), level: translate(to.language, `triage.levels.${item.level}`) },
      linkPath: `/staff/triage/${item.id}`,
      dedupeKey: `${template}:${item.id}:${occasion}:${to.email}`,
    }, transaction)
  }
}

/** What raised a level, from the diary or a lab result: the rules' answer and when it came. */
export interface TriageFinding { patientId: number, level: TriageLevel, reasons: TriageReason[], respondBy: Date | null, at: Date }

/** Where an item comes from: its source and a key that names the record ("diary:12", "lab:7"). */
export interface TriageOrigin { source: TriageSource, sourceKey: string, diaryEntryId?: number }

/**
 * Opens a queue item inside the caller's transaction (with the change that caused it) and
 * alerts the nurses on duty for urgent and emergency items. A level below routine opens
 * nothing; a second call for the same source key does nothing: each source opens at most
 * one item.
 */
export async function openTriageItem({ source, sourceKey, diaryEntryId }: TriageOrigin, finding: TriageFinding, transaction: Transaction): Promise<TriageItem | null> {
  if (!QUEUED.includes(finding.level)) return null
  const [item, created] = await TriageItem.findOrCreate({
    where: { sourceKey },
    defaults: {
      patientId: finding.patientId,
      source,
      sourceKey,
      diaryEntryId: diaryEntryId ?? null,
      level: finding.level,
      reasons: finding.reasons,
      respondBy: finding.respondBy,
      assigneeUserId: null,
      disposition: null,
      escalatedAt: null,
      closedAt: null,
    },
    transaction,
  })
  if (!created) return null
  await TriageEvent.create({ itemId: item.id, actorUserId: null, type: 'created', note: null, at: finding.at }, { transaction })
  if (ALERTED.includes(item.level)) {
    const settings = await getSettings(transaction)
    await alertStaff(item, 'triageAlert', settings.nursesOnDuty, transaction)
  }
  return item
}

export function openTriageItemForEntry(entry: DiaryEntry, transaction: Transaction) {
  const origin = { source: 'diary' as const, sourceKey: `diary:${entry.id}`, diaryEntryId: entry.id }
  return openTriageItem(origin, { ...entry.get({ plain: true }), at: entry.submittedAt }, transaction)
}

/**
 * Items still new after their respond-by time go to the clinicians: a second e-mail, an
 * "escalated" event, and the item shows as overdue. An emergency item (respond at once) goes
 * on when still new `emergencyEscalationMinutes` after it opened (clinic setting, 15). The conditional update makes it once
 * per item, even when two runs overlap. Returns how many were escalated.
 */
export async function escalateOverdueItems(now: Date): Promise<number> {
  const sequelize = await useDb()
  const settings = await getSettings()
  // An emergency item's respond-by is the minute it opened; it escalates on a target of its own.
  const emergencyBefore = new Date(now.getTime() - settings.emergencyEscalationMinutes * 60_000)
  const due = await TriageItem.findAll({
    where: {
      status: 'new',
      escalatedAt: { [Op.is]: null },
      [Op.or]: [
        { level: ['urgent', 'routine'], respondBy: { [Op.lt]: now } },
        { level: 'emergency', respondBy: { [Op.lt]: emergencyBefore } },
      ],
    },
    order: [['respondBy', 'ASC']],
  })
  let escalated = 0
  for (const item of due) {
    await sequelize.transaction(async (transaction) => {
      const [changed] = await TriageItem.update({ escalatedAt: now }, { where: { id: item.id, escalatedAt: { [Op.is]: null }, status: 'new' }, transaction })
      if (changed !== 1) return
      await TriageEvent.create({ itemId: item.id, actorUserId: null, type: 'escalated', note: null, data: { automatic: true }, at: now }, { transaction })
      await alertStaff(item, 'triageEscalation', settings.clinicianAlertList, transaction)
      escalated++
    })
  }
  return escalated
}

/**
 * An injection past its window (state "overdue": risk of testosterone escape) opens one
 * urgent item per cycle: the source key carries the missed due date. Returns how many opened.
 */
export async function openOverdueInjectionItems(now: Date): Promise<number> {
  const sequelize = await useDb()
  const clock = await scheduleClock(now)
  const patients = await Patient.findAll({ attributes: ['id'], include: [{ model: User, as: 'user', attributes: [], where: { active: true } }] })
  const standings = await computeSchedules(patients.map(p => p.id), clock)
  const overdue = [...standings].flatMap(([patientId, s]) => s.state === 'overdue' && s.dueDate ? [{ patientId, sourceKey: `overdue:${patientId}:${s.dueDate}` }] : [])
  // Cycles that already have their item are skipped in one read; openTriageItem still opens at most one per key.
  const existing = overdue.length ? await TriageItem.findAll({ where: { sourceKey: overdue.map(o => o.sourceKey) }, attributes: ['sourceKey'] }) : []
  const known = new Set(existing.map(i => i.sourceKey))
  let opened = 0
  for (const { patientId, sourceKey } of overdue.filter(o => !known.has(o.sourceKey))) {
    const item = await sequelize.transaction(transaction => openTriageItem({ source: 'overdue-injection', sourceKey }, {
      patientId,
      level: 'urgent',
      reasons: [{
        rule: 'injection-overdue',
        level: 'urgent',
        reasonKey: 'triage.queue.overdueReason',
        instructionKey: 'triage.queue.overdueInstruction',
        source: 'GnRH-agonist depot prescribing information, dosing interval; the window is a clinic setting (common practice)',
      }],
      respondBy: new Date(now.getTime() + clock.settings.urgentResponseHours * 3600_000),
      at: now,
    }, transaction))
    if (item) opened++
  }
  return opened
}
