import { Op } from 'sequelize'
import type { Transaction } from 'sequelize'
import { OutboxMessage } from '../db/models'
import type { OutboxAttachment } from '../db/models/outbox-message'
import type { Language } from '../../shared/types/roles'

const MAX_BACKOFF_MS = 60 * 60 * 1000

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

/**
 * Writes an e-mail to the outbox inside the caller's transaction, so the e-mail exists if
 * and only if the change that caused it was committed. Returns false for a duplicate key.
 */
export async function enqueueMail(mail: QueuedMail, transaction: Transaction): Promise<boolean> {
  const link = mail.linkPath ? new URL(mail.linkPath, useRuntimeConfig().publicUrl).toString() : undefined
  const rendered = renderMail(mail.template, mail.language, mail.params ?? {}, link)
  const values = {
    to: mail.to,
    ...rendered,
    attachments: mail.attachments ?? [],
    dedupeKey: mail.dedupeKey ?? null,
    lastError: null,
    sentAt: null,
  }
  if (!mail.dedupeKey) {
    await OutboxMessage.create(values, { transaction })
    return true
  }
  const [, created] = await OutboxMessage.findOrCreate({ where: { dedupeKey: mail.dedupeKey }, defaults: values, transaction })
  return created
}

export function backoffMs(attempts: number, baseMs: number): number {
  return Math.min(baseMs * 2 ** Math.max(0, attempts - 1), MAX_BACKOFF_MS)
}

let running: Promise<number> | undefined

/**
 * Sends every due message, oldest first. A message is marked sent only after the SMTP
 * server accepted it; a failure schedules the next try with exponential backoff, without
 * limit, so nothing is dropped. One pass at a time per process.
 */
export function processOutbox(now = () => new Date()): Promise<number> {
  running ??= (async () => {
    await useDb()
    const baseMs = Number(useRuntimeConfig().outboxRetryBaseMs)
    const due = await OutboxMessage.findAll({
      where: { status: 'pending', nextAttemptAt: { [Op.lte]: now() } },
      order: [['nextAttemptAt', 'ASC'], ['id', 'ASC']],
      limit: 50,
    })
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
        await message.update({ status: 'sent', sentAt: now(), attempts: message.attempts + 1, lastError: null })
        sent++
      }
      catch (error) {
        const attempts = message.attempts + 1
        await message.update({
          attempts,
          lastError: String((error as Error).message ?? error).slice(0, 500),
          nextAttemptAt: new Date(now().getTime() + backoffMs(attempts, baseMs)),
        })
      }
    }
    return sent
  })().finally(() => {
    running = undefined
  })
  return running
}
