import { createError } from 'h3'
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
 * A validator for readValidatedBody / getValidatedQuery: one 400 shape everywhere,
 * { message: 'errors.invalidInput', data: { fieldErrors } }, which the forms show at the field.
 */
export function parseWith<T extends ZodTypeAny>(schema: T) {
  return (input: unknown): z.infer<T> => {
    const result = schema.safeParse(input)
    if (!result.success) {
      throw createError({ statusCode: 400, message: 'errors.invalidInput', data: { fieldErrors: fieldErrors(result.error) } })
    }
    return result.data
  }
}
