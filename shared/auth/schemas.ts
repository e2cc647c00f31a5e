import { z } from 'zod'
import { LANGUAGES, ROLES } from './roles'
import { safeText, UNSAFE_TEXT_MESSAGE } from '../common/text'
import { isoDateSchema } from '../common/dates'

// Error messages are locale keys; the client translates them at the field.
export const emailSchema = z.string({ required_error: 'validation.email.required' })
  .trim()
  .toLowerCase()
  .min(1, 'validation.email.required')
  .max(254, 'validation.email.invalid')
  .email('validation.email.invalid')

export const PASSWORD_MIN_LENGTH = 12

/** One character, or a block of two or three, repeated all the way (case ignored): "aaaa", "abab". */
export function isRepetitive(password: string): boolean {
  const chars = [...password.toLowerCase()]
  return [1, 2, 3].some(size => chars.length > size && chars.every((c, i) => c === chars[i % size]))
}

/** Each character one up, or each one down, from the one before: "abcdef", "987654", "1234567890". */
export function isSequence(password: string): boolean {
  const codes = [...password.toLowerCase()].map(c => c.codePointAt(0)!)
  if (codes.length < 3) return false
  const step = (a: number, b: number) => (a === 57 && b === 48 ? 1 : a === 48 && b === 57 ? -1 : b - a)
  const first = step(codes[0]!, codes[1]!)
  return (first === 1 || first === -1) && codes.every((c, i) => i === 0 || step(codes[i - 1]!, c) === first)
}

// A password may hold any printable character (spaces, symbols, any script), never NUL or a control character.
// eslint-disable-next-line no-control-regex
const NO_CONTROL_CHARACTERS = /^[^\u0000-\u001F\u007F-\u009F]*$/

/**
 * NIST SP 800-63B: length, no composition rules. Also refused here (client and server):
 * one character or a short block repeated, and plain sequences. The server refuses
 * common passwords and the user's own e-mail, name, the clinic's name and "Tidewell" as
 * well (server/utils/auth/password.ts).
 */
export const newPasswordSchema = z.string({ required_error: 'validation.password.tooShort' })
  .min(PASSWORD_MIN_LENGTH, 'validation.password.tooShort')
  .max(128, 'validation.password.tooLong')
  .regex(NO_CONTROL_CHARACTERS, UNSAFE_TEXT_MESSAGE)
  .refine(password => !isRepetitive(password), 'validation.password.repetitive')
  .refine(password => !isSequence(password), 'validation.password.sequence')

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'validation.password.required').max(128, 'validation.password.tooLong'),
}).strict()

export const forgotPasswordSchema = z.object({ email: emailSchema }).strict()

export const setPasswordSchema = z.object({
  token: z.string().min(16, 'validation.token.invalid').max(128, 'validation.token.invalid'),
  password: newPasswordSchema,
}).strict()

export const languageSchema = z.object({ language: z.enum(LANGUAGES) }).strict()

export const createUserSchema = z.object({
  email: emailSchema,
  name: safeText().trim().min(1, 'validation.name.required').max(120, 'validation.name.tooLong'),
  role: z.enum(ROLES),
  language: z.enum(LANGUAGES).default('en'),
  patient: z.object({
    clinicNumber: safeText().trim().min(1, 'validation.clinicNumber.required').max(32, 'validation.clinicNumber.invalid'),
    dateOfBirth: isoDateSchema,
  }).strict().optional(),
}).strict().superRefine((value, ctx) => {
  if (value.role === 'patient' && !value.patient) {
    ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['patient', 'clinicNumber'], message: 'validation.clinicNumber.required' })
  }
  if (value.role !== 'patient' && value.patient) {
    ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['patient'], message: 'validation.patient.notAllowed' })
  }
})

export type CreateUserInput = z.infer<typeof createUserSchema>
