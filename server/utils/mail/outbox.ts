import { randomUUID } from 'node:crypto'
import { Op } from 'sequelize'
import type { Transaction } from 'sequelize'
import { OutboxMessage } from '../../db/models'
import type { OutboxAttachment } from '../../db/models/outbox-message'
import type { Language } from '#shared/auth/roles'

/** The longest an ordinary e-mail waits between two tries. */
export const MAX_BACKOFF_MS = 60 * 60 * 1000
/**
 * Alerts to staff about an urgent or emergency item keep a short schedule of their own:
 * the first retry after at most 15 s, doubling, never more than 2 minutes apart, so an
 * outage of the mail server delays an alert by minutes, not by the hour-long ceiling.
 */
export const ALERT_FIRST_RETRY_MS = 15_000
export const ALERT_MAX_BACKOFF_MS = 2 * 60 * 1000
export const ALERT_TEMPLATES = ['triageAlert', 'triageEscalation'] as const

export interface QueuedMail {
  to: string
  template: string
  language: Language
  params?: Record<string, string | number>
  /** Path (e.g. /set-password?token=...) turned into an absolute link in the e-mail. */
  linkPath?: string
  attachments?: OutboxAttachment[]
  /** When set, a second message with the same key is silently not queued. */
  dedupeKey?: string
}

/** Where an e-mail to a person goes and in which language: his address, his language. */
export const mailTo = (person: { email: string, language: Language }) => ({ to: person.email, language: person.language })

/**
 * Writes an e-mail to the outbox inside the caller's transaction, so the e-mail exists if
 * and only if the change that caused it was committed. Returns false for a duplicate key.
 */
export async function enqueueMail(mail: QueuedMail, transaction: Transaction): Promise<boolean> {
  const dedupeKey = alertKey(mail)
  const link = mail.linkPath ? new URL(mail.linkPath, useRuntimeConfig().publicUrl).toString() : undefined
  const rendered = renderMail(mail.template, mail.language, mail.params ?? {}, link)
  const values = {
    to: mail.to,
    ...rendered,
    attachments: mail.attachments ?? [],
    dedupeKey,
    lastError: null,
    sentAt: null,
  }
  if (!dedupeKey) {
    await OutboxMessage.create(values, { transaction })
    return true
  }
  const [, created] = await OutboxMessage.findOrCreate({ where: { dedupeKey }, defaults: values, transaction })
  return created
}

/**
 * The stored message keeps no template name, so an alert is known by its dedupe key,
 * which for an alert template always starts with "<template>:" (added here when the
 * caller's key does not, and made up when it has none).
 */
function alertKey(mail: QueuedMail): string | null {
  const template = ALERT_TEMPLATES.find(t => t === mail.template)
  if (!template) return mail.dedupeKey ?? null
  const key = mail.dedupeKey ?? randomUUID()
  return key.startsWith(`${template}:`) ? key : `${template}:${key}`
}

/** Whether an outbox row is an alert to staff (see alertKey). */
export function isAlertMessage(message: { dedupeKey: string | null }): boolean {
  return ALERT_TEMPLATES.some(t => message.dedupeKey?.startsWith(`${t}:`))
}

const ALERT_KEY_PATTERNS = ALERT_TEMPLATES.map(t => ({ [Op.like]: `${t}:%` }))

/** Sequelize conditions for alert rows and for the others (worker, admin's outbox page). */
export const alertWhere = { dedupeKey: { [Op.or]: ALERT_KEY_PATTERNS } }
export const notAlertWhere = { [Op.or]: [{ dedupeKey: null }, { [Op.not]: alertWhere }] }

/**
 * How long to wait after the given number of failed tries: the base doubling each time,
 * at most one hour; for an alert, at most 15 s the first time and never over 2 minutes.
 */
export function retryDelayMs(attempts: number, baseMs: number, alert = false): number {
  const doublings = 2 ** Math.max(0, attempts - 1)
  if (alert) return Math.min(Math.min(baseMs, ALERT_FIRST_RETRY_MS) * doublings, ALERT_MAX_BACKOFF_MS)
  return Math.min(baseMs * doublings, MAX_BACKOFF_MS)
}

/** A send failure as it was last seen by this process, for the admin's outbox page. */
let lastFailure: { at: Date, error: string } | null = null
let lastSentAt: Date | null = null

export function lastSendOutcome() {
  return { lastFailure, lastSentAt }
}

/** An SMTP error without the addresses it may quote (they can be patients' addresses). */
export function sendErrorText(error: unknown): string {
  const text = String((error as Error)?.message ?? error)
  return text.replace(/[^\s<>()"',;:]+@[^\s<>()"',;:]+/g, '[address]').slice(0, 500)
}

let running: Promise<number> | undefined

/**
 * How long a claimed message is kept from the other instances while this one sends it. An
 * instance that dies while sending leaves its claim, and whoever is alive sends the message
 * once the claim has run out (the SMTP client gives up long before).
 */
export const CLAIM_MS = 10 * 60 * 1000

/**
 * Claims up to 50 due messages, alerts first, then oldest first: in one short transaction
 * they are locked (passing over those another instance is claiming) and their next try is
 * moved to the end of the claim, so no other instance finds them due. The claim's time is
 * the token: the outcome is written only while the message still carries it.
 */
async function claimDue(now: Date): Promise<{ due: OutboxMessage[], claimedUntil: Date }> {
  const sequelize = await useDb()
  const claimedUntil = new Date(now.getTime() + CLAIM_MS)
  const due = await rowLockTransaction(sequelize, async (transaction) => {
    const dueNow = { status: 'pending', nextAttemptAt: { [Op.lte]: now } }
    const order: [string, string][] = [['nextAttemptAt', 'ASC'], ['id', 'ASC']]
    const alerts = await OutboxMessage.findAll({ where: { ...dueNow, ...alertWhere }, order, limit: 50, ...claimLocks(transaction) })
    const others = alerts.length < 50
      ? await OutboxMessage.findAll({ where: { ...dueNow, ...notAlertWhere }, order, limit: 50 - alerts.length, ...claimLocks(transaction) })
      : []
    const claimed = [...alerts, ...others]
    if (claimed.length) await OutboxMessage.update({ nextAttemptAt: claimedUntil }, { where: { id: claimed.map(m => m.id) }, transaction })
    return claimed
  })
  return { due, claimedUntil }
}

/**
 * Sends every due message, alerts first, then oldest first. A message is marked sent only
 * after the SMTP server accepted it; a failure schedules the next try with exponential
 * backoff (retryDelayMs), without limit, so nothing is dropped. One pass at a time per
 * process; several processes on one database each send the messages they claimed
 * (claimDue), so each message is sent once.
 */
export function processOutbox(now = () => new Date()): Promise<number> {
  running ??= (async () => {
    const baseMs = Number(useRuntimeConfig().outboxRetryBaseMs)
    const { due, claimedUntil } = await claimDue(now())
    const stillMine = (message: OutboxMessage) => ({ where: { id: message.id, status: 'pending', nextAttemptAt: claimedUntil } })
    let sent = 0
    for (const message of due) {
      try {
        await useMailer().sendMail({
          from: useRuntimeConfig().mailFrom,
          to: message.to,
          subject: message.subject,
          text: message.text,
          html: message.html,
          messageId: `<outbox-${message.id}@tidewell.local>`,
          attachments: message.attachments.map(a => ({ filename: a.filename, contentType: a.contentType, content: a.content })),
        })
        lastSentAt = now()
        await OutboxMessage.update({ status: 'sent', sentAt: lastSentAt, attempts: message.attempts + 1, lastError: null }, stillMine(message))
        sent++
      }
      catch (error) {
        const attempts = message.attempts + 1
        lastFailure = { at: now(), error: sendErrorText(error) }
        await OutboxMessage.update({
          attempts,
          lastError: lastFailure.error,
          nextAttemptAt: new Date(now().getTime() + retryDelayMs(attempts, baseMs, isAlertMessage(message))),
        }, stillMine(message))
      }
    }
    return sent
  })().finally(() => {
    running = undefined
  })
  return running
}
