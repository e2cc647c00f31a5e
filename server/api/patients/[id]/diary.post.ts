import { diaryEntrySchema } from '../../../../shared/schemas/diary'

/**
 * A weekly diary entry, from the patient or a caregiver allowed to log. The server works
 * out the triage (the authority) and stores it with the entry; urgent and emergency
 * entries also open a triage queue item in the same transaction.
 */
export default defineEventHandler(async (event) => {
  const { user, patient } = await authorizePatient(event, idParam(event), 'diary.write')
  const answers = await readValidatedBody(event, parseWith(diaryEntrySchema))
  const sequelize = await useDb()
  const view = await sequelize.transaction(async (transaction) => {
    const { entry } = await storeDiaryEntry({ patient, enteredBy: user, answers, submittedAt: new Date() }, transaction)
    await openTriageItemForEntry(entry, transaction)
    return diaryView(entry, enteredByOf(user, patient))
  })
  setResponseStatus(event, 201)
  return view
})
