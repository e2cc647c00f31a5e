import { TriageItem } from '../../db/models'

/** One queue item with the entry as given, its timeline and the patient's context. */
export default defineEventHandler(async (event) => {
  const staff = await requireRole(event, ['nurse', 'clinician'])
  const item = await TriageItem.findByPk(idParam(event) || 0)
  if (!item) throw createError({ statusCode: 404, message: 'errors.notFound' })
  await authorizePatient(event, item.patientId, 'triage.work', staff)
  return triageDetail(item, new Date())
})
