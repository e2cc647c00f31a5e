import { rightNowReportSchema } from '#shared/diary/schemas'

/**
 * A right-now "yes" sent the moment it is answered, before the rest of the diary: opens
 * the entry under the draft id with its emergency queue item and alerts the nurses on
 * duty (201), or adds the items to the entry already opened (200). The patient or a
 * caregiver allowed to log.
 */
export default defineEventHandler(async (event) => {
  const { user, patient } = await authorizePatient(event, idParam(event), 'diary.write')
  const report = await readValidatedBody(event, parseWith(rightNowReportSchema))
  const { entry, created } = await inDraftTransaction(transaction => reportRightNow({ patient, enteredBy: user, draftId: report.draftId, items: report.items, at: new Date() }, transaction))
  setResponseStatus(event, created ? 201 : 200)
  return diaryEntryReply(entry.id, patient)
})
