import type { z, ZodError, ZodTypeAny } from 'zod'

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
