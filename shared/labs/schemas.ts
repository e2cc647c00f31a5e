import { z } from 'zod'
import { TESTOSTERONE_UNITS } from './lab-triage'
import { isoDateSchema } from '../common/dates'
import { safeText } from '../common/text'

/*
 * Staff: enter one lab or ECG result. One shape per kind (discriminated on `kind`), used
 * by the vee-validate form and by the route. `today` is the calendar date in the clinic's
 * time zone (the page passes the one the server sent). Ranges are wide enough for any real
 * result and catch a slipped decimal point or a wrong unit. Messages are locale keys under
 * validation.labs.
 */

const message = (key: string) => `validation.labs.${key}`

/** What a typed decimal may look like: digits, with one decimal point or comma. */
const DECIMAL = /^\d{1,6}([.,]\d{1,6})?$/

/**
 * A number, or the text of a form field holding a plain decimal (an empty field is "not
 * answered"; a decimal comma is accepted). Nothing else becomes a number: true, "1e3",
 * "0x1" and "Infinity" are refused.
 */
const measured = (min: number, max: number) => z.preprocess(
  (value) => {
    if (typeof value !== 'string') return value ?? undefined
    const typed = value.trim()
    if (typed === '') return undefined
    return DECIMAL.test(typed) ? Number(typed.replace(',', '.')) : typed
  },
  z.number({ required_error: message('valueRequired'), invalid_type_error: message('valueRequired') })
    .finite(message('valueRequired'))
    .min(min, message('valueOutOfRange'))
    .max(max, message('valueOutOfRange')),
)

const EARLIEST = '2000-01-01'

const note = safeText({ multiLine: true }).trim().max(500, message('noteTooLong')).optional().transform(value => value || undefined)

export function labResultSchema(today: string) {
  const takenOn = z.string({ required_error: message('dateRequired'), invalid_type_error: message('dateRequired') })
    .min(1, message('dateRequired'))
    .pipe(isoDateSchema
      .refine(value => value <= today, message('futureDate'))
      .refine(value => value >= EARLIEST, message('tooOld')))
  const common = { takenOn, note }
  // Not strict: the form keeps the fields of the other kinds; they are dropped here.
  return z.discriminatedUnion('kind', [
    z.object({
      kind: z.literal('testosterone'),
      ...common,
      unit: z.enum(TESTOSTERONE_UNITS, { errorMap: () => ({ message: message('unitRequired') }) }),
      value: measured(0, 2000),
    }),
    z.object({ kind: z.literal('psa'), ...common, value: measured(0.01, 10_000) }),
    z.object({ kind: z.literal('hba1c'), ...common, value: measured(3, 20) }),
    z.object({ kind: z.literal('qtc'), ...common, value: measured(200, 800), heartRate: measured(20, 250) }),
  ], { errorMap: () => ({ message: message('kindRequired') }) }).superRefine((input, ctx) => {
    // 70 nmol/L is about 2000 ng/dL: far above any man's level.
    if (input.kind === 'testosterone' && input.unit === 'nmol/L' && input.value > 70) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['value'], message: message('valueOutOfRange') })
    }
  })
}
export type LabResultInput = z.infer<ReturnType<typeof labResultSchema>>
