import { FIXED_UNITS } from '#shared/labs/lab-triage'
import { FULFILLED_BY_LAB } from '#shared/monitoring/rules'
import { respondBy } from '#shared/triage/rules'
import { labResultSchema } from '#shared/labs/schemas'
import { LabResult } from '../../../db/models'

/**
 * Staff (nurses and clinicians) enter one lab or ECG result. A result the clinic's lab
 * rules put at routine or above opens a triage queue item in the same transaction; urgent
 * ones also alert the nurses on duty. The result fulfils the item of his monitoring plan it
 * answers (testosterone, PSA, HbA1c for glucose, QTc for the ECG).
 */
export default defineEventHandler(async (event) => {
  const { patient, user } = await authorizePatient(event, idParam(event), 'labs.record')
  const clock = await scheduleClock()
  const input = await readValidatedBody(event, parseWith(labResultSchema(clock.today)))
  const { settings, now } = clock

  const sequelize = await useDb()
  const view = await sequelize.transaction(async (transaction) => {
    const created = await LabResult.create({
      patientId: patient.id,
      kind: input.kind,
      takenOn: input.takenOn,
      value: input.value,
      unit: input.kind === 'testosterone' ? input.unit : FIXED_UNITS[input.kind],
      heartRate: input.kind === 'qtc' ? input.heartRate : null,
      note: input.note ?? null,
      enteredByUserId: user.id,
    }, { transaction })
    await fulfilMonitoringItem(patient.id, FULFILLED_BY_LAB[input.kind], input.takenOn, transaction)
    const { results, context } = await labContextOf(patient.id, transaction)
    const result = labResultView(results.find(r => r.id === created.id)!, context)
    const deadlines = { urgentHours: settings.urgentResponseHours, routineWorkingDays: settings.routineResponseWorkingDays }
    await openTriageItem({ source: 'lab', sourceKey: `lab:${created.id}` }, { patientId: patient.id, ...result, respondBy: respondBy(result.level, now, deadlines, settings.timeZone), at: now }, transaction)
    return result
  })
  setResponseStatus(event, 201)
  return view
})
