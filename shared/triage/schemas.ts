import { z } from 'zod'
import { LEVELS } from './rules'
import { idNumber, intQuery, safeText } from '../common/text'

export const TRIAGE_SOURCES = ['diary', 'overdue-injection', 'lab', 'visit', 'message'] as const
export type TriageSource = (typeof TRIAGE_SOURCES)[number]

export const TRIAGE_STATUSES = ['new', 'in-progress', 'waiting', 'closed'] as const
export type TriageItemStatus = (typeof TRIAGE_STATUSES)[number]

export const DISPOSITIONS = ['self-care', 'visit-booked', 'sent-to-emergency', 'clinician-review', 'no-action'] as const
export type Disposition = (typeof DISPOSITIONS)[number]

export const TRIAGE_EVENT_TYPES = [
  'created', 'claimed', 'note', 'call-attempted', 'call-reached', 'message-sent',
  'waiting', 'escalated', 'disposition-set', 'closed',
  // The entry's note was read; a right-now report added items; the rest of the diary arrived.
  'note-read', 'right-now-added', 'diary-completed',
  // Another message from the patient's circle joined the thread's open item (issue 13).
  'message-received',
] as const
export type TriageEventType = (typeof TRIAGE_EVENT_TYPES)[number]

const note = safeText({ multiLine: true }).trim().min(1, 'validation.triage.noteRequired').max(2000, 'validation.triage.noteTooLong')
const optionalNote = safeText({ multiLine: true }).trim().max(2000, 'validation.triage.noteTooLong').optional()

/** What a nurse or clinician can record on an item: one body shape per event type. */
export const triageActionSchema = z.discriminatedUnion('type', [
  // `from`: the assignee the nurse saw (null: nobody). When given, the claim holds only if the
  // item still has that assignee, so of two nurses taking one item at once only one wins.
  z.object({ type: z.literal('claim'), from: idNumber().nullable().optional() }).strict(),
  z.object({ type: z.literal('note'), note }).strict(),
  z.object({ type: z.literal('call'), reached: z.boolean(), note: optionalNote }).strict(),
  z.object({ type: z.literal('message'), note }).strict(),
  z.object({ type: z.literal('waiting'), note: optionalNote }).strict(),
  z.object({ type: z.literal('escalate'), note }).strict(),
  z.object({ type: z.literal('disposition'), disposition: z.enum(DISPOSITIONS, { errorMap: () => ({ message: 'validation.triage.disposition' }) }), note: optionalNote }).strict(),
  z.object({ type: z.literal('close'), note: optionalNote }).strict(),
  z.object({ type: z.literal('note-read') }).strict(),
], { errorMap: () => ({ message: 'validation.triage.actionType' }) })
export type TriageAction = z.infer<typeof triageActionSchema>

export const triageQuerySchema = z.object({
  level: z.enum(LEVELS).optional(),
  // 'open': not closed; 'escalated': open and sent on to the clinicians.
  status: z.enum([...TRIAGE_STATUSES, 'open', 'escalated'] as const).default('open'),
  assignee: z.enum(['me', 'anyone', 'nobody']).default('anyone'),
  q: safeText().trim().max(100).optional(),
  page: intQuery({ min: 1, max: 10_000, fallback: 1 }),
  pageSize: intQuery({ min: 1, max: 100, fallback: 50 }),
}).strict()
