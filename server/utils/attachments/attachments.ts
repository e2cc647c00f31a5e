import { randomUUID } from 'node:crypto'
import type { H3Event } from 'h3'
import { createError, readMultipartFormData } from 'h3'
import { Op } from 'sequelize'
import type { User as SessionUser } from '#auth-utils'
import { isStaff } from '#shared/auth/roles'
import { PENDING_UPLOAD_HOURS, safeFileName } from '#shared/attachments/rules'
import type { Patient } from '../../db/models'
import { Attachment, Message } from '../../db/models'
import { checkFile } from './content'

/**
 * The one file of an upload (a multipart part named "file" with a file name). Anything else
 * in the body (more files, other fields) is refused, so the route stores exactly what it checked.
 */
export async function readUploadedFile(event: H3Event): Promise<{ name: string, bytes: Buffer }> {
  const parts = await readMultipartFormData(event).catch(() => undefined)
  const files = (parts ?? []).filter(part => part.filename !== undefined)
  if (!parts || parts.length !== 1 || files.length !== 1 || files[0]!.name !== 'file') {
    throw fieldError('file', 'validation.attachments.oneFile')
  }
  return { name: files[0]!.filename ?? '', bytes: files[0]!.data }
}

/**
 * Checks an uploaded file by its bytes, keeps the checked copy in the object store under a
 * random key (nothing of the patient or the file name in it) and records it, pending until
 * its uploader sends it with a message.
 */
export async function storeUpload(patient: Patient, uploader: SessionUser, file: { name: string, bytes: Buffer }): Promise<Attachment> {
  const checked = await checkFile(file.bytes)
  const objectKey = `attachments/${randomUUID()}`
  await putObject(objectKey, checked.bytes, checked.mime)
  return Attachment.create({
    patientId: patient.id,
    messageId: null,
    objectKey,
    kind: checked.kind,
    mime: checked.mime,
    byteSize: checked.bytes.length,
    fileName: safeFileName(file.name, checked.extension),
    width: checked.width,
    height: checked.height,
    pages: checked.pages,
    uploadedByUserId: uploader.id,
    labResultId: null,
  })
}

/**
 * Whether the person asking (already allowed to read this patient's messages) may see this
 * file: a pending one only its uploader; one on a message entered in error only staff.
 */
export async function mayOpenAttachment(attachment: Attachment, user: SessionUser): Promise<boolean> {
  if (!attachment.messageId) return attachment.uploadedByUserId === user.id || (isStaff(user.role) && attachment.labResultId !== null)
  if (isStaff(user.role)) return true
  const message = await Message.findByPk(attachment.messageId, { attributes: ['id', 'enteredInErrorAt'] })
  return !!message && !message.enteredInErrorAt
}

/** The attachment named by the route, or a 404 (the same for one that does not exist). */
export async function findAttachment(id: number): Promise<Attachment> {
  const attachment = id ? await Attachment.findByPk(id) : null
  if (!attachment) throw createError({ statusCode: 404, message: 'errors.notFound' })
  return attachment
}

/** Content-Disposition for a download: an ASCII name and the UTF-8 one (RFC 6266, RFC 5987). */
export function downloadDisposition(fileName: string): string {
  const ascii = fileName.replace(/[^\x20-\x7e]/g, '_').replace(/[\\"]/g, '_')
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(fileName)}`
}

/**
 * Removes the uploads nobody sent: pending (on no message, filed as no result) and older
 * than PENDING_UPLOAD_HOURS. Each row goes in its own conditional DELETE, so an upload sent
 * with a message at that very moment stays (the send then finds it gone and says so at the
 * field, the message unsent); its file is removed from the store after the row. Returns how
 * many were removed (a file the store could not remove is logged, its row already gone).
 */
export async function prunePendingUploads(now: Date): Promise<number> {
  const cutoff = new Date(now.getTime() - PENDING_UPLOAD_HOURS * 3600_000)
  const pending = { messageId: { [Op.is]: null }, labResultId: { [Op.is]: null } }
  const stale = await Attachment.findAll({ where: { ...pending, createdAt: { [Op.lt]: cutoff } }, attributes: ['id', 'objectKey'], order: [['id', 'ASC']] })
  let removed = 0
  for (const upload of stale) {
    if (!await Attachment.destroy({ where: { id: upload.id, ...pending } })) continue
    removed++
    await deleteObject(upload.objectKey).catch((error: unknown) => {
      console.error(`[tidewell] attachments:prune could not remove ${upload.objectKey}:`, error instanceof Error ? error.message : error)
    })
  }
  return removed
}
