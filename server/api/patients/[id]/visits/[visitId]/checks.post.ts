import { windowCheck } from '#shared/visit/rules'
import { visitChecksSchema } from '#shared/visit/schemas'
import { TriageItem } from '../../../../../db/models'

/**
 * The checks before the kit: identity read back, the hypersensitivity question, the
 * right-now signs asked in person, and the window. A known hypersensitivity stops the visit
 * (the dose is contraindicated) and alerts the clinician; a right-now "yes" goes the diary's
 * right-now way (an emergency item, the nurses alerted) and the dose is not given today. A
 * day outside the window needs a reason (400 on windowReason until given).
 */
export default defineEventHandler(async (event) => {
  const { patient, user } = await authorizePatient(event, idParam(event), 'injection.record')
  const input = await readValidatedBody(event, parseWith(visitChecksSchema))
  const clock = await scheduleClock()
  const sequelize = await useDb()
  const visit = await sequelize.transaction(async (transaction) => {
    const visit = await findVisit(event, patient, transaction)
    requireHere(visit)
    const standing = await computeSchedule(patient.id, { ...clock, today: visit.visitDate }, transaction)
    const window = windowCheck(standing, visit.visitDate)
    const outside = window.position === 'early' || window.position === 'late'
    if (outside && !input.windowReason && !input.hypersensitivity && !input.rightNow.length) throw fieldError('windowReason', 'validation.visit.windowReason')
    const checks = {
      checkedAt: clock.now,
      checkedByUserId: user.id,
      hypersensitivity: input.hypersensitivity,
      rightNow: input.rightNow,
      windowCheck: window,
      windowReason: input.windowReason ?? null,
    }
    if (input.rightNow.length) {
      // The diary's own right-now path: an entry with the signs, its emergency item and alert.
      const { entry } = await reportRightNow({ patient, enteredBy: user, draftId: `visit-${visit.id}`, items: input.rightNow, at: clock.now }, transaction)
      const item = await TriageItem.findOne({ where: { sourceKey: `diary:${entry.id}` }, transaction })
      return visit.update({ ...checks, status: 'not-given', notGivenReason: 'unwell', triageItemId: item?.id ?? null, closedAt: clock.now, closedByUserId: user.id }, { transaction })
    }
    if (input.hypersensitivity) {
      const item = await raiseHypersensitivity(visit, clock, transaction)
      return visit.update({ ...checks, status: 'stopped', triageItemId: item?.id ?? null, closedAt: clock.now, closedByUserId: user.id }, { transaction })
    }
    return visit.update(checks, { transaction })
  })
  return visitView(visit, patient, clock)
})
