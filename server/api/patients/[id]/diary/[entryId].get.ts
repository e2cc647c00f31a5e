import { createError } from 'h3'
import { DiaryEntry, User } from '../../../../db/models'

/** One of his diary entries with its triage, for the result page he can come back to. */
export default defineEventHandler(async (event) => {
  const { patient } = await authorizePatient(event, idParam(event), 'patient.read')
  const entryId = idParam(event, 'entryId')
  const entry = entryId
    ? await DiaryEntry.findOne({
        where: { id: entryId, patientId: patient.id },
        include: [{ model: User, as: 'enteredBy', attributes: ['id', 'name', 'role'] }],
      })
    : null
  if (!entry) throw createError({ statusCode: 404, message: 'errors.notFound' })
  return diaryView(entry, enteredByOf(entry.enteredBy!, patient))
})
