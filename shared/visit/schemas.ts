import { z } from 'zod'
import { SITES } from '../schedule/rules'
import { RIGHT_NOW_ITEMS } from '../triage/rules'
import { isoDateSchema } from '../common/dates'
import { hasUnsafeCharacters, idNumber, safeText, UNSAFE_TEXT_MESSAGE } from '../common/text'
import { NOT_GIVEN_REASONS } from './rules'

/*
 * The injection visit's steps: one schema per step, for the form and the route. Error
 * messages are locale keys under validation.visit. Times are the clinic's clock ('HH:mm')
 * on the visit's day.
 */
const message = (key: string) => `validation.visit.${key}`
const yes = (key: string) => z.literal(true, { errorMap: () => ({ message: message(key) }) })
const clockTime = z.string({ required_error: message('timeRequired') })
  .regex(/^([01]\d|2[0-3]):[0-5]\d$/, message('timeRequired'))
const note = (max: number) => safeText({ multiLine: true }).trim().max(max, message('noteTooLong')).optional().transform(value => value || undefined)

/**
 * A carton scan as a handheld scanner types it: a GS1 element string, where the GS character
 * (ASCII 29, FNC1) ends a variable-length field such as the lot. That one control character is
 * kept; every other one a text field refuses (safeText) is refused here too, before the trim.
 */
// eslint-disable-next-line no-control-regex
const GROUP_SEPARATORS = /\u001D/g
const scannedText = z.string()
  .refine(value => !hasUnsafeCharacters(value.replace(GROUP_SEPARATORS, '')), UNSAFE_TEXT_MESSAGE)
  .pipe(z.string().trim().max(120, message('barcode')))

/** Open a visit: for a booked appointment, or a walk-in (no appointment). */
export const openVisitSchema = z.object({
  appointmentId: z.union([idNumber(message('appointment')), z.null()], { errorMap: () => ({ message: message('appointment') }) }),
}).strict()

/**
 * Before the kit: his name and date of birth read back to him, the hypersensitivity question,
 * the right-now signs asked in person (the ones he says yes to), and a reason when today is
 * outside his window.
 */
export const visitChecksSchema = z.object({
  identityConfirmed: yes('identity'),
  hypersensitivity: z.boolean({ required_error: message('hypersensitivity'), invalid_type_error: message('hypersensitivity') }),
  rightNow: z.array(z.enum(RIGHT_NOW_ITEMS, { errorMap: () => ({ message: message('rightNow') }) })).max(RIGHT_NOW_ITEMS.length),
  rightNowAsked: yes('rightNowAsked'),
  windowReason: note(300),
}).strict()

/**
 * The kit: its label scanned (the GS1 string) or typed (lot and expiry), the regimen it is,
 * and the inspection. A scan, when given, wins over typed values.
 */
export const visitKitSchema = z.object({
  barcode: scannedText.optional().transform(value => value || undefined),
  lotNumber: safeText().trim().max(40, message('lotInvalid'))
    .regex(/^$|^[A-Za-z0-9][A-Za-z0-9 ./-]*$/, message('lotInvalid')).optional().transform(value => value || undefined),
  lotExpiresOn: z.string().optional().transform(value => value || undefined).pipe(isoDateSchema.optional()),
  regimenId: idNumber(message('regimenRequired')),
  powderOk: z.boolean({ required_error: message('inspection'), invalid_type_error: message('inspection') }),
  diluentOk: z.boolean({ required_error: message('inspection'), invalid_type_error: message('inspection') }),
}).strict().superRefine((value, ctx) => {
  if (value.barcode) return
  if (!value.lotNumber) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['lotNumber'], message: message('lotRequired') })
  if (!value.lotExpiresOn) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['lotExpiresOn'], message: message('expiryRequired') })
})

/** The kit mixed, at a clock time. */
export const kitMixedSchema = z.object({ mixedAt: clockTime }).strict()

/** A kit thrown away: blood seen on aspiration, or a defect found. */
export const kitDiscardSchema = z.object({
  reason: z.enum(['blood-on-aspiration', 'kit-defect'], { errorMap: () => ({ message: message('wasteReason') }) }),
  note: note(500),
}).strict()

/**
 * The dose given from one mixed kit: the site, aspiration checked, the whole dose (a part
 * of one is refused: the prescribing information forbids splitting a dose), sharps
 * disposed of. `lateMixAcknowledged` answers the warning that the time from mixing is over
 * the clinic's limit.
 */
export const giveDoseSchema = z.object({
  kitId: idNumber(message('kit')),
  givenAt: clockTime,
  site: z.enum(SITES, { errorMap: () => ({ message: message('siteRequired') }) }),
  aspirationChecked: yes('aspiration'),
  wholeDose: yes('wholeDose'),
  sharpsDisposed: yes('sharps'),
  lateMixAcknowledged: z.boolean().optional().default(false),
}).strict()

/** Not given today, with the reason. */
export const notGivenSchema = z.object({
  reason: z.enum(NOT_GIVEN_REASONS, { errorMap: () => ({ message: message('notGivenReason') }) }),
  note: note(500),
}).strict()

/** After the dose: what was seen, and the next appointment inside the next window. */
export function visitAfterSchema(today: string) {
  return z.object({
    observationNote: note(1000),
    next: z.object({
      date: isoDateSchema.refine(value => value > today, message('nextDate')),
      time: clockTime,
      place: safeText().trim().min(1, message('placeRequired')).max(160, message('placeRequired')),
    }).strict(),
  }).strict()
}

export type VisitChecksInput = z.infer<typeof visitChecksSchema>
export type VisitKitInput = z.infer<typeof visitKitSchema>
export type GiveDoseInput = z.infer<typeof giveDoseSchema>
