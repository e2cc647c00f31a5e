import { z } from 'zod'
import { SITES } from './rules'
import { CHANGE_DECISIONS } from './statuses'
import { isoDateSchema } from '../common/dates'
import { requestIdSchema } from '../common/request-id'
import { idNumber, safeText } from '../common/text'

/*
 * The injection-schedule forms: one schema per form, used by vee-validate (toTypedSchema)
 * and by the server route (readValidatedBody). Rules that depend on the date take `today`,
 * the calendar date in the clinic's time zone: the page passes the one the server sent,
 * the route its own. Error messages are locale keys under validation.schedule.
 */

const message = (key: string) => `validation.schedule.${key}`

/**
 * A needed calendar date; an empty field is "not answered". A rule on the date (in the
 * past, after today) is only checked once there is a real date.
 */
const date = (required: string, rule?: (value: string) => boolean, key = '') => z.string({ required_error: message(required), invalid_type_error: message(required) })
  .min(1, message(required))
  .pipe(rule ? isoDateSchema.refine(rule, message(key)) : isoDateSchema)

/** An optional calendar date: an empty field counts as not given. */
const optionalDate = (rule: (value: string) => boolean, key: string) => z.string().optional()
  .transform(value => value?.trim() || undefined)
  .pipe(isoDateSchema.refine(rule, message(key)).optional())

const clockTime = z.string({ required_error: message('timeRequired') })
  .min(1, message('timeRequired'))
  .regex(/^([01]\d|2[0-3]):[0-5]\d$/, message('timeInvalid'))

const optionalNote = safeText({ multiLine: true }).trim().max(500, message('noteTooLong')).optional().transform(value => value || undefined)

const place = safeText({ required_error: message('placeRequired') }).trim()
  .min(1, message('placeRequired'))
  .max(160, message('placeTooLong'))

/** A record id from a <select> (its options carry numbers; text or true is refused). */
const positiveId = (required: string) => idNumber(message(required))

/** Staff: record one injection that was given (never one in the future). */
export function recordInjectionSchema(today: string) {
  return z.object({
    date: date('dateRequired', value => value <= today, 'futureDate'),
    time: clockTime,
    site: z.enum(SITES, { errorMap: () => ({ message: message('siteRequired') }) }),
    lotNumber: safeText({ required_error: message('lotRequired') }).trim()
      .min(1, message('lotRequired'))
      .max(40, message('lotInvalid'))
      .regex(/^$|^[A-Za-z0-9][A-Za-z0-9 ./-]*$/, message('lotInvalid')),
    lotExpiresOn: date('expiryRequired'),
    regimenId: positiveId('regimenRequired'),
    note: optionalNote,
  }).strict().superRefine((value, ctx) => {
    if (value.lotExpiresOn && value.date && value.lotExpiresOn < value.date) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['lotExpiresOn'], message: message('lotExpired') })
    }
  })
}

/** Staff: put a patient on a regimen from a date. */
export const setRegimenSchema = z.object({
  regimenId: positiveId('regimenRequired'),
  startsOn: date('dateRequired'),
}).strict()

/** Admins and clinicians: a regimen of the clinic's own. */
export const createRegimenSchema = z.object({
  name: safeText({ required_error: message('regimenNameRequired') }).trim()
    .min(2, message('regimenNameRequired'))
    .max(60, message('regimenNameTooLong')),
  intervalDays: z.number({ required_error: message('intervalRange'), invalid_type_error: message('intervalRange') })
    .int(message('intervalRange')).min(7, message('intervalRange')).max(366, message('intervalRange')),
}).strict()

/**
 * Staff: book an appointment (today or later). `replaces` is the open appointment the form
 * showed (null: none); when given and it is no longer the one open, the booking answers
 * 409 instead of replacing an appointment the nurse has not seen.
 */
export function scheduleAppointmentSchema(today: string) {
  return z.object({
    date: date('dateRequired', value => value >= today, 'pastDate'),
    time: clockTime,
    place,
    durationMinutes: z.number({ invalid_type_error: message('durationRange') }).int(message('durationRange'))
      .min(5, message('durationRange')).max(240, message('durationRange')).default(30),
    replaces: idNumber().nullable().optional(),
  }).strict()
}

/**
 * Patient or caregiver: ask for another time, with up to three preferred dates (the first
 * is needed; all after today and all different) and a note. The same requestId again
 * returns the request the first try stored.
 */
export function changeRequestSchema(today: string) {
  const later = (value: string) => value > today
  return z.object({
    firstChoice: date('choiceRequired', later, 'choiceNotFuture'),
    secondChoice: optionalDate(later, 'choiceNotFuture'),
    thirdChoice: optionalDate(later, 'choiceNotFuture'),
    note: optionalNote,
    requestId: requestIdSchema,
  }).strict().superRefine((value, ctx) => {
    const seen = new Set<string>()
    for (const key of ['firstChoice', 'secondChoice', 'thirdChoice'] as const) {
      const chosen = value[key]
      if (!chosen) continue
      if (seen.has(chosen)) ctx.addIssue({ code: z.ZodIssueCode.custom, path: [key], message: message('choiceRepeated') })
      seen.add(chosen)
    }
  })
}

/**
 * Patient or caregiver: ask the clinic to cancel the appointment (`cancel: true`, what the
 * button he pressed says), with a note if he likes.
 */
export const cancelRequestSchema = z.object({
  cancel: z.literal(true, { errorMap: () => ({ message: message('cancelConfirm') }) }),
  note: optionalNote,
  requestId: requestIdSchema,
}).strict()

/** Staff: cancel an open appointment, with the reason (shown to him in the app). */
export const cancelAppointmentSchema = z.object({
  reason: safeText({ multiLine: true, required_error: message('cancelReason') }).trim()
    .min(1, message('cancelReason')).max(500, message('noteTooLong')),
}).strict()

/** The preferred dates of a change request, in the order given. */
export function preferredDatesOf(input: { firstChoice: string, secondChoice?: string, thirdChoice?: string }): string[] {
  return [input.firstChoice, input.secondChoice, input.thirdChoice].filter((value): value is string => Boolean(value))
}

/** Staff: answer a change request by moving the appointment or keeping its time. */
export function answerChangeRequestSchema(today: string) {
  return z.object({
    decision: z.enum(CHANGE_DECISIONS, { errorMap: () => ({ message: message('decisionRequired') }) }),
    date: optionalDate(value => value >= today, 'pastDate'),
    time: z.string().optional().transform(value => value || undefined)
      .pipe(z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, message('timeInvalid')).optional()),
    place: safeText().trim().max(160, message('placeTooLong')).optional().transform(value => value || undefined),
    note: optionalNote,
  }).strict().superRefine((value, ctx) => {
    if (value.decision !== 'move') return
    if (!value.date) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['date'], message: message('dateRequired') })
    if (!value.time) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['time'], message: message('timeRequired') })
  })
}
