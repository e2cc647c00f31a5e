/*
 * What a message may carry: photos (a rash, the injection site) and PDFs (an outside lab
 * report, a letter). The type is read from the bytes on the server, never from the name or
 * the type the browser declares. Limits are the clinic's defaults (common practice for a
 * phone photo and a scanned letter; not from a published source).
 */

/** At most this many bytes per file (10 MB). */
export const ATTACHMENT_MAX_BYTES = 10 * 1024 * 1024

/** At most this many files on one message. */
export const ATTACHMENTS_PER_MESSAGE = 4

/**
 * An upload never sent with a message (nor filed into the record) is removed, file and
 * row, once it is this many hours old (the attachments:prune task, daily).
 */
export const PENDING_UPLOAD_HOURS = 24

/** A photo is re-encoded to fit inside this many pixels on its longer edge. */
export const IMAGE_MAX_EDGE = 2400

/** The types accepted, as their bytes say (file-type's answer), and what each is stored as. */
export const ACCEPTED_TYPES = {
  'image/jpeg': 'image',
  'image/png': 'image',
  'image/webp': 'image',
  'application/pdf': 'pdf',
} as const
export type AcceptedMime = keyof typeof ACCEPTED_TYPES
export type AttachmentKind = (typeof ACCEPTED_TYPES)[AcceptedMime]

export function isAcceptedMime(mime: string | undefined): mime is AcceptedMime {
  return mime !== undefined && Object.hasOwn(ACCEPTED_TYPES, mime)
}

/**
 * A file name fit to show and to offer as a download name: the last path part, control
 * characters and quotes gone, at most 120 characters, the extension the bytes say.
 */
export function safeFileName(name: string, extension: string): string {
  const base = [...(name.split(/[\\/]/).pop() ?? '')]
    .filter(character => character.charCodeAt(0) >= 0x20 && character.charCodeAt(0) !== 0x7f && !'"\'<>`'.includes(character))
    .join('')
    .replace(/\.[^.]*$/, '')
    .trim()
    .slice(0, 120)
  return `${base || 'attachment'}.${extension}`
}
