import { z } from 'zod'

/*
 * Input hygiene (issue 11). Text fields refuse NUL, C0/C1 control characters and the bidi
 * override/isolate characters (U+202A-U+202E, U+2066-U+2069), which can hide or reorder
 * what a name or note shows in a page or an e-mail; multi-line notes keep newline,
 * carriage return and tab.
 * Numbers and ids are never coerced: a JSON body sends a number, and a route parameter or
 * query string (always text) must be plain digits, so `true`, "1e3", " 1" and "0x1" are
 * refused instead of becoming 1, 1000 or 1.
 */
// eslint-disable-next-line no-control-regex
const UNSAFE_SINGLE_LINE = /[\u0000-\u001F\u007F-\u009F\u202A-\u202E\u2066-\u2069]/
// eslint-disable-next-line no-control-regex
const UNSAFE_MULTI_LINE = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F\u202A-\u202E\u2066-\u2069]/
// The same sets as "nothing but allowed characters", for zod's regex check.
// eslint-disable-next-line no-control-regex
const SAFE_SINGLE_LINE = /^[^\u0000-\u001F\u007F-\u009F\u202A-\u202E\u2066-\u2069]*$/
// eslint-disable-next-line no-control-regex
const SAFE_MULTI_LINE = /^[^\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F\u202A-\u202E\u2066-\u2069]*$/

export const UNSAFE_TEXT_MESSAGE = 'validation.text.unsafe'

/** True when the text holds a character a text field refuses. */
export function hasUnsafeCharacters(value: string, multiLine = false): boolean {
  return (multiLine ? UNSAFE_MULTI_LINE : UNSAFE_SINGLE_LINE).test(value)
}

/**
 * A string schema that refuses those characters with the message validation.text.unsafe.
 * It stays a z.string(), so each field adds its own trim, min and max after it; the check
 * runs first, before trim, so a refused character at either end is not trimmed away.
 */
export function safeText(options: { multiLine?: boolean, message?: string, required_error?: string, invalid_type_error?: string } = {}) {
  const { multiLine, message, ...params } = options
  return z.string(params).regex(multiLine ? SAFE_MULTI_LINE : SAFE_SINGLE_LINE, message ?? UNSAFE_TEXT_MESSAGE)
}

const DIGITS = /^\d{1,10}$/
const MAX_ID = 2 ** 31 - 1

interface IntQueryOptions {
  min?: number
  max?: number
  message?: string
  /** The value when the parameter is missing or empty. */
  fallback?: number
  /** Missing or empty is allowed (undefined). */
  optional?: boolean
}

/**
 * A whole number from a query string or route parameter: plain digits only (no sign,
 * space, exponent or hex), then Number. An empty value counts as not given.
 */
export function intQuery(options: IntQueryOptions & { optional: true }): z.ZodType<number | undefined, z.ZodTypeDef, unknown>
export function intQuery(options?: IntQueryOptions): z.ZodType<number, z.ZodTypeDef, unknown>
export function intQuery(options: IntQueryOptions = {}): z.ZodType<number | undefined, z.ZodTypeDef, unknown> {
  const message = options.message ?? 'validation.generic.invalid'
  const digits = z.string({ required_error: message, invalid_type_error: message })
    .regex(DIGITS, message)
    .transform(Number)
    .pipe(z.number().int().min(options.min ?? 0, message).max(options.max ?? MAX_ID, message))
  const emptyAsMissing = (value: unknown) => (value === '' ? undefined : value)
  if (options.fallback !== undefined) return z.preprocess(emptyAsMissing, digits.default(String(options.fallback)))
  if (options.optional) return z.preprocess(emptyAsMissing, digits.optional())
  return z.preprocess(emptyAsMissing, digits)
}

/** A record id from a query string or route parameter (1 and up, plain digits). */
export function idString(options: Omit<IntQueryOptions, 'min'> & { optional: true }): z.ZodType<number | undefined, z.ZodTypeDef, unknown>
export function idString(options?: Omit<IntQueryOptions, 'min'>): z.ZodType<number, z.ZodTypeDef, unknown>
export function idString(options: Omit<IntQueryOptions, 'min'> = {}): z.ZodType<number | undefined, z.ZodTypeDef, unknown> {
  return intQuery({ ...options, min: 1 } as IntQueryOptions)
}

/** A record id in a JSON body: a whole number, never text or true. */
export function idNumber(message = 'validation.generic.invalid') {
  return z.number({ required_error: message, invalid_type_error: message })
    .int(message)
    .positive(message)
    .max(MAX_ID, message)
}
