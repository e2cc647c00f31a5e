import { z } from 'zod'

/**
 * The id a form makes once (crypto.randomUUID()) and sends with every try of the same
 * filled-in form, so the server can tell a retry or a double click from a new request and
 * answer with the record the first try stored. Optional: older clients send none.
 */
export const requestIdSchema = z.string({ invalid_type_error: 'validation.generic.requestId' })
  .uuid('validation.generic.requestId')
  .optional()
