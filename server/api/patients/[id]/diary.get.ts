import { z } from 'zod'
import { intQuery } from '#shared/common/text'
import { DiaryEntry, TriageItem, User } from '../../../db/models'

const querySchema = z.object({
  page: intQuery({ min: 1, max: 10_000, fallback: 1 }),
  pageSize: intQuery({ min: 1, max: 100, fallback: 20 }),
})

/** His diary entries, newest first, a page at a time. */
export default defineEventHandler(async (event) => {
  const { patient } = await authorizePatient(event, idParam(event), 'patient.read')
  const { page, pageSize } = await getValidatedQuery(event, parseWith(querySchema))
  const { rows, count } = await DiaryEntry.findAndCountAll({
    where: { patientId: patient.id },
    include: [
      { model: User, as: 'enteredBy', attributes: ['id', 'name', 'role'] },
      { model: TriageItem, as: 'triageItem', attributes: ['status', 'disposition', 'closedAt'] },
    ],
    distinct: true,
    order: [['submittedAt', 'DESC'], ['id', 'DESC']],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  })
  return {
    page,
    pageSize,
    total: count,
    entries: rows.map((entry) => {
      const item = entry.triageItem
      return diaryView(entry, attributionOf(entry.enteredBy!, patient.userId), item ?? null)
    }),
  }
})
