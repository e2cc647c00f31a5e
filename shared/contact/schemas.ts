import { z } from 'zod'
import { safeText } from '../common/text'

/*
 * How the care team reaches a man: his phone numbers (up to three), the best times to call
 * him and how he prefers to be contacted; and a caregiver's own phone. Used by the contact
 * form and the routes. Messages are locale keys under validation.contact.
 */

const message = (key: string) => `validation.contact.${key}`

export const PHONE_LABELS = ['mobile', 'home', 'work', 'other'] as const
export type PhoneLabel = (typeof PHONE_LABELS)[number]

export const CONTACT_PREFERENCES = ['phone', 'email', 'caregiver'] as const
export type ContactPreference = (typeof CONTACT_PREFERENCES)[number]

export const MAX_PHONES = 3
export const BEST_TIMES_MAX_LENGTH = 200

/*
 * A phone number as people write it: digits with spaces, dots, dashes and brackets, an
 * optional leading + and an optional extension ("x 12", "ext. 12"). Between 7 and 15
 * digits before the extension (15 is the longest international number, ITU-T E.164).
 */
const PHONE_PATTERN = /^\+?\(?[0-9]([0-9 ().-]*[0-9])?(\s*(x|ext\.?)\s*[0-9]{1,6})?$/i
const MIN_DIGITS = 7
const MAX_DIGITS = 15

function digitsBeforeExtension(value: string): number {
  return value.split(/x|ext/i)[0]!.replace(/\D/g, '').length
}

/** Control and bidi characters are refused (validation.text.unsafe), not silently taken out. */
export const phoneNumberSchema = safeText({ required_error: message('phoneRequired'), invalid_type_error: message('phoneInvalid') })
  .trim()
  .min(1, message('phoneRequired'))
  .max(40, message('phoneInvalid'))
  .regex(PHONE_PATTERN, message('phoneInvalid'))
  .refine(value => digitsBeforeExtension(value) >= MIN_DIGITS && digitsBeforeExtension(value) <= MAX_DIGITS, message('phoneInvalid'))

export const patientPhoneSchema = z.object({
  label: z.enum(PHONE_LABELS, { errorMap: () => ({ message: message('phoneLabel') }) }),
  number: phoneNumberSchema,
}).strict(message('unknownField'))
export type PatientPhone = z.infer<typeof patientPhoneSchema>

/** PUT /api/patients/:id/contact: the patient himself or staff. */
export const patientContactSchema = z.object({
  phones: z.array(patientPhoneSchema, { required_error: message('phones'), invalid_type_error: message('phones') })
    .max(MAX_PHONES, message('tooManyPhones')),
  bestTimes: safeText({ invalid_type_error: message('bestTimes') })
    .trim()
    .max(BEST_TIMES_MAX_LENGTH, message('bestTimesTooLong')),
  preferred: z.enum(CONTACT_PREFERENCES, { errorMap: () => ({ message: message('preferred') }) }),
}).strict(message('unknownField'))
export type PatientContact = z.infer<typeof patientContactSchema>

/** PUT /api/me/phone: a caregiver's own phone, or null to remove it. */
export const ownPhoneSchema = z.object({
  phone: phoneNumberSchema.nullable(),
}).strict(message('unknownField'))
