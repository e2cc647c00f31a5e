import { z } from 'zod'
import { LANGUAGES, ROLES } from '../types/roles'

// Error messages are locale keys; the client translates them at the field.
export const emailSchema = z.string({ required_error: 'validation.email.required' })
  .trim()
  .toLowerCase()
  .min(1, 'validation.email.required')
  .max(254, 'validation.email.invalid')
  .email('validation.email.invalid')

/** Length rules; the server also refuses commonly used passwords. */
export const newPasswordSchema = z.string({ required_error: 'validation.password.tooShort' })
  .min(10, 'validation.password.tooShort')
  .max(128, 'validation.password.tooLong')

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

/** A real calendar date written YYYY-MM-DD. */
export const isoDateSchema = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'validation.date.invalid')
  .refine(value => !Number.isNaN(Date.parse(`${value}T00:00:00Z`)) && new Date(`${value}T00:00:00Z`).toISOString().startsWith(value), 'validation.date.invalid')

export const createUserSchema = z.object({
  email: emailSchema,
  name: z.string().trim().min(1, 'validation.name.required').max(120, 'validation.name.tooLong'),
  role: z.enum(ROLES),
  language: z.enum(LANGUAGES).default('en'),
  patient: z.object({
    clinicNumber: z.string().trim().min(1, 'validation.clinicNumber.required').max(32, 'validation.clinicNumber.invalid'),
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
