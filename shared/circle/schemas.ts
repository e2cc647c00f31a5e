import { z } from 'zod'
import { LANGUAGES } from '../auth/roles'
import { emailSchema, newPasswordSchema } from '../auth/schemas'
import { requestIdSchema } from '../common/request-id'
import { safeText } from '../common/text'

// Error messages are locale keys; the client translates them at the field.

const flag = z.boolean({ required_error: 'validation.generic.invalid_type', invalid_type_error: 'validation.generic.invalid_type' })

/** What a caregiver may do besides viewing (viewing comes with every grant). */
export const circlePermissionsSchema = z.object({
  canLogDiary: flag,
  canManageAppointments: flag,
  // Added with messages (issue 13): left out, the grant keeps what it had.
  canMessage: flag.optional(),
}).strict()

/**
 * The patient (or staff on his behalf) invites a caregiver by e-mail. The name goes into
 * the e-mail's greeting, so it may not carry a web address or markup. The same requestId
 * again returns the invitation the first try stored.
 */
export const circleInviteSchema = z.object({
  name: safeText({ required_error: 'validation.name.required' }).trim().min(1, 'validation.name.required').max(120, 'validation.name.tooLong')
    .refine(name => !/https?:|www\.|[<>]/i.test(name), 'validation.circle.nameNoLinks'),
  email: emailSchema,
  language: z.enum(LANGUAGES).default('en'),
  canLogDiary: flag,
  canManageAppointments: flag,
  canMessage: flag.default(false),
  requestId: requestIdSchema,
}).strict()

/**
 * Accepting an invitation. A caregiver who is new to Tidewell sends his name and a new
 * password; one who already has an account sends nothing and must be signed in.
 */
export const acceptInvitationSchema = z.object({
  name: safeText().trim().min(1, 'validation.name.required').max(120, 'validation.name.tooLong').optional(),
  password: newPasswordSchema.optional(),
}).strict()

export type CircleInviteInput = z.infer<typeof circleInviteSchema>
