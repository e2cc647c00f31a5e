import { z } from 'zod'

/*
 * Text fields refuse NUL, C0/C1 control characters and the bidi override/isolate
 * characters (U+202A-U+202E, U+2066-U+2069), which can hide or reorder what a name or note
 * shows in a page or an e-mail. Multi-line notes keep newline and tab.
 * Not yet used by the schemas (issue 11, input hygiene: work in progress).
 */
// eslint-disable-next-line no-control-regex
const UNSAFE_SINGLE_LINE = /[\u0000-\u001F\u007F-\u009F\u202A-\u202E\u2066-\u2069]/
// eslint-disable-next-line no-control-regex
const UNSAFE_MULTI_LINE = /[\u0000-\u0008\u000B-\u001F\u007F-\u009F\u202A-\u202E\u2066-\u2069]/

/** True when the text holds a character a text field refuses. */
export function hasUnsafeCharacters(value: string, multiLine = false): boolean {
  return (multiLine ? UNSAFE_MULTI_LINE : UNSAFE_SINGLE_LINE).test(value)
}

/** A string schema that refuses those characters with the message validation.text.unsafe. */
export function safeText(options: { multiLine?: boolean, message?: string } = {}) {
  return z.string().refine(value => !hasUnsafeCharacters(value, options.multiLine), options.message ?? 'validation.text.unsafe')
}
