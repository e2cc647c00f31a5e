/**
 * Uploads one file (multipart/form-data, one part named "file", at most 10 MB) for a
 * message about this patient. It is checked by its bytes (a photo re-encoded without its
 * metadata, a PDF that must load), kept in the object store under a random key, and stays
 * pending until the same person sends it with a message. 201 with what was stored.
 */
export default defineEventHandler(async (event) => {
  const { patient, user } = await authorizePatient(event, idParam(event), 'message.write')
  const file = await readUploadedFile(event)
  const attachment = await storeUpload(patient, user, file)
  setResponseStatus(event, 201)
  return attachmentView(attachment)
})
