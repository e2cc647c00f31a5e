import { createError } from 'h3'

/** One of his diary entries with its triage and the care team's review, for the result page he can come back to. */
export default defineEventHandler(async (event) => {
  const { patient } = await authorizePatient(event, idParam(event), 'patient.read')
  const entryId = idParam(event, 'entryId')
  const view = entryId ? await findDiaryEntryView(entryId, patient) : null
  if (!view) throw createError({ statusCode: 404, message: 'errors.notFound' })
  return view
})
