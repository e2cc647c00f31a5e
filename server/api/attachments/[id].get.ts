/**
 * One attachment's bytes, through the access policy (another patient's file answers 404,
 * as does a pending one to anyone but its uploader and, for the patient's circle, one on a
 * message entered in error). Always a download with the type its bytes were checked as,
 * never shown inline from the app's origin; every view by anyone but the patient is in the
 * audit trail.
 */
export default defineEventHandler(async (event) => {
  const user = await requireActiveUser(event)
  const attachment = await findAttachment(idParam(event)).catch(() => null)
  await authorizePatient(event, attachment?.patientId ?? 0, 'message.read', user)
  if (!attachment || !await mayOpenAttachment(attachment, user)) throw createError({ statusCode: 404, message: 'errors.notFound' })
  const bytes = await getObject(attachment.objectKey)
  setResponseHeaders(event, {
    'content-type': attachment.mime,
    'content-length': bytes.length,
    'content-disposition': downloadDisposition(attachment.fileName),
    'x-content-type-options': 'nosniff',
    'cache-control': 'private, no-store',
    'content-security-policy': 'default-src \'none\'; sandbox',
  })
  return bytes
})
