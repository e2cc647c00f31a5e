import { fileTypeFromBuffer } from 'file-type'
import { PDFDocument } from 'pdf-lib'
import sharp from 'sharp'
import type { AcceptedMime, AttachmentKind } from '#shared/attachments/rules'
import { ACCEPTED_TYPES, ATTACHMENT_MAX_BYTES, IMAGE_MAX_EDGE, isAcceptedMime } from '#shared/attachments/rules'
import { fieldError } from '../core/validation'

/** A file as it will be stored: its checked type and the bytes to keep. */
export interface CheckedFile {
  kind: AttachmentKind
  mime: AcceptedMime
  extension: string
  bytes: Buffer
  /** Pixels of a photo after re-encoding; pages of a PDF. */
  width: number | null
  height: number | null
  pages: number | null
}

/**
 * Reads an uploaded file by its bytes (file-type), never by its name or declared type, and
 * makes the copy to keep: a photo is decoded and written again by sharp, turned upright and
 * fitted inside IMAGE_MAX_EDGE, with no metadata (EXIF, GPS location, camera) carried over;
 * a PDF must load with pdf-lib and is kept as sent (it is only ever served as a download).
 * Anything else, too large, or unreadable is refused at the field with a 400.
 */
export async function checkFile(bytes: Buffer, field = 'file'): Promise<CheckedFile> {
  if (bytes.length === 0) throw fieldError(field, 'validation.attachments.empty')
  if (bytes.length > ATTACHMENT_MAX_BYTES) throw fieldError(field, 'validation.attachments.tooLarge', 413)
  const detected = await fileTypeFromBuffer(bytes)
  if (!isAcceptedMime(detected?.mime)) throw fieldError(field, 'validation.attachments.type', 415)
  const mime = detected.mime
  if (ACCEPTED_TYPES[mime] === 'pdf') {
    const pages = await PDFDocument.load(bytes, { updateMetadata: false })
      .then(document => document.getPageCount())
      .catch(() => null)
    if (!pages) throw fieldError(field, 'validation.attachments.unreadable')
    return { kind: 'pdf', mime, extension: 'pdf', bytes, width: null, height: null, pages }
  }
  try {
    // limitInputPixels guards against a small file that decodes to a huge image.
    const { data, info } = await sharp(bytes, { limitInputPixels: 100_000_000 })
      .rotate()
      .resize({ width: IMAGE_MAX_EDGE, height: IMAGE_MAX_EDGE, fit: 'inside', withoutEnlargement: true })
      .jpeg({ quality: 85, mozjpeg: true })
      .toBuffer({ resolveWithObject: true })
    return { kind: 'image', mime: 'image/jpeg', extension: 'jpg', bytes: data, width: info.width, height: info.height, pages: null }
  }
  catch {
    throw fieldError(field, 'validation.attachments.unreadable')
  }
}
