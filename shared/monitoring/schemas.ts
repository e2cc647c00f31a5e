import { z } from 'zod'
import { MONITORING_KINDS } from './rules'
import { isoDateSchema } from '../common/dates'
import { idNumber, safeText } from '../common/text'

/*
 * The monitoring plan's forms and request bodies, used by vee-validate and by the routes.
 * Rules on dates take `today`, the clinic's calendar date (the page passes the one the
 * server sent). Messages are locale keys under validation.monitoring.
 */

const message = (key: string) => `validation.monitoring.${key}`

const kind = z.enum(MONITORING_KINDS, { errorMap: () => ({ message: message('kindRequired') }) })

const requiredDate = z.string({ required_error: message('dateRequired'), invalid_type_error: message('dateRequired') })
  .min(1, message('dateRequired'))
  .pipe(isoDateSchema)

/** Whole days between checks: a number, or the digits typed in a form field. A week to four years. */
const intervalDays = z.preprocess(
  value => (typeof value === 'string' && /^\s*\d{1,5}\s*$/.test(value) ? Number(value) : value === '' ? undefined : value),
  z.number({ required_error: message('intervalRequired'), invalid_type_error: message('intervalRequired') })
    .int(message('intervalRequired'))
    .min(7, message('intervalOutOfRange'))
    .max(1461, message('intervalOutOfRange')),
)

const note = safeText({ multiLine: true }).trim().max(500, message('noteTooLong')).nullish().transform(value => value || null)

const owner = idNumber(message('ownerRequired'))

/** One item of the plan as the clinician sets it. */
export const planItemSchema = z.object({ kind, intervalDays, firstDueOn: requiredDate, active: z.boolean(), note })
export type PlanItemInput = z.infer<typeof planItemSchema>

/** PUT the whole plan: its owner and every item (each kind at most once). */
export const monitoringPlanSchema = z.object({
  ownerUserId: owner,
  items: z.array(planItemSchema).min(1, message('itemsRequired')).max(MONITORING_KINDS.length)
    .refine(items => new Set(items.map(item => item.kind)).size === items.length, message('kindTwice')),
})
export type MonitoringPlanInput = z.infer<typeof monitoringPlanSchema>

/** Make the plan (or make it again after a regimen change) from the clinic defaults. */
export const applyDefaultsSchema = z.object({ ownerUserId: owner })

/** Staff: a check done outside Tidewell's results (an ECG, a scan, a blood pressure), on a day. */
export function markDoneSchema(today: string) {
  return z.object({
    kind,
    doneOn: requiredDate.pipe(z.string().refine(value => value <= today, message('futureDate'))),
    note,
  })
}
export type MarkDoneInput = z.infer<ReturnType<typeof markDoneSchema>>
