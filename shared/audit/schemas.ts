import { z } from 'zod'
import { isoDateSchema } from '../common/dates'
import { idString, safeText } from '../common/text'
import { STORED_AUDIT_OUTCOMES } from './outcomes'

const emptyAsUndefined = (value: unknown) => (value === '' ? undefined : value)

/** Filters of the admin audit page and its CSV export (query string). */
export const auditQuerySchema = z.object({
  actor: idString({ optional: true }),
  patient: idString({ optional: true }),
  action: z.preprocess(emptyAsUndefined, safeText().trim().max(64).regex(/^[a-z0-9.-]+$/, 'validation.generic.invalid').optional()),
  outcome: z.preprocess(emptyAsUndefined, z.enum(STORED_AUDIT_OUTCOMES).optional()),
  from: z.preprocess(emptyAsUndefined, isoDateSchema.optional()),
  to: z.preprocess(emptyAsUndefined, isoDateSchema.optional()),
  page: idString({ fallback: 1, max: 10_000 }),
}).strict().refine(v => !v.from || !v.to || v.from <= v.to, { path: ['to'], message: 'validation.audit.toBeforeFrom' })

export const pageQuerySchema = z.object({
  page: idString({ fallback: 1, max: 10_000 }),
}).strict()

export type AuditQuery = z.infer<typeof auditQuerySchema>
