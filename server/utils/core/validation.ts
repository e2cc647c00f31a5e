import type { z, ZodError, ZodTypeAny } from 'zod'
import { createError } from 'h3'

/** Field path -> locale keys of what is wrong there. */
export function fieldErrors(error: ZodError): Record<string, string[]> {
  const result: Record<string, string[]> = {}
  for (const issue of error.issues) {
    const path = issue.path.join('.') || '_'
    const message = issue.message.startsWith('validation.') ? issue.message : `validation.generic.${issue.code}`
    ;(result[path] ??= []).push(message)
  }
  return result
}

/**
 * What parseWith throws. h3's readValidatedBody / getValidatedQuery turn it into a 400
 * whose message is 'errors.invalidInput' and whose data is this object, so every bad
 * input answers { message, data: { fieldErrors } }, which the forms show at the field.
 */
export class InvalidInput {
  readonly message = 'errors.invalidInput'
  constructor(readonly fieldErrors: Record<string, string[]>) {}
}

/** A validator for readValidatedBody and getValidatedQuery from a zod schema. */
export function parseWith<T extends ZodTypeAny>(schema: T) {
  return (input: unknown): z.infer<T> => {
    const result = schema.safeParse(input)
    if (!result.success) throw new InvalidInput(fieldErrors(result.error))
    return result.data
  }
}

/**
 * The error for one field the schema could not judge (a time in the past, a name taken):
 * throw fieldError('email', 'validation.circle.alreadyMember', 409). The message defaults to
 * 'errors.invalidInput' (400) or 'errors.alreadyExists' (409), as the forms expect.
 */
export function fieldError(field: string, keys: string | string[], statusCode = 400, message?: string) {
  const list = Array.isArray(keys) ? keys : [keys]
  return createError({
    statusCode,
    message: message ?? (statusCode === 409 ? 'errors.alreadyExists' : 'errors.invalidInput'),
    data: { fieldErrors: { [field]: list } },
  })
}
