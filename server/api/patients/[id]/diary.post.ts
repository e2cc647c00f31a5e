import { diarySubmissionSchema } from '#shared/diary/schemas'

/**
 * A weekly diary entry, from the patient or a caregiver allowed to log. The server works
 * out the triage (the authority) and stores it with the entry; routine and higher entries
 * open a triage queue item in the same transaction. With the draft id of an entry a
 * right-now report opened, the answers complete that entry and its item (200); with the
 * draft id of a complete entry, that entry comes back unchanged (200); otherwise 201.
 */
export default defineEventHandler(async (event) => {
  const { user, patient } = await authorizePatient(event, idParam(event), 'diary.write')
  const submission = await readValidatedBody(event, parseWith(diarySubmissionSchema))
  const { entry, created } = await inDraftTransaction(transaction => submitDiary({ patient, enteredBy: user, submission, at: new Date() }, transaction))
  setResponseStatus(event, created ? 201 : 200)
  return diaryEntryReply(entry.id, patient)
})
