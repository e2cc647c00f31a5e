import type { Transaction } from 'sequelize'
import { evaluateLabTriage, FIXED_UNITS, interpretLab } from '#shared/labs/lab-triage'
import type { LabResultInput } from '#shared/labs/schemas'
import { FULFILLED_BY_LAB } from '#shared/monitoring/rules'
import { respondBy } from '#shared/triage/rules'
import type { LabContext, LabReading } from '#shared/labs/lab-triage'
import type { LabResultView } from '#shared/labs/views'
import { Injection, LabResult, User } from '../../db/models'
import type { ScheduleClock } from '../schedule/clock'

function readingOf(result: LabResult): LabReading {
  return { id: result.id, kind: result.kind, takenOn: result.takenOn, value: result.value, unit: result.unit, heartRate: result.heartRate }
}

/** His results (oldest first) and the date of his first injection, for the interpretations. */
export async function labContextOf(patientId: number, transaction?: Transaction): Promise<{ results: LabResult[], context: LabContext }> {
  const results = await LabResult.findAll({
    where: { patientId },
    include: [{ model: User, as: 'enteredBy', attributes: ['id', 'name'] }],
    order: [['takenOn', 'ASC'], ['id', 'ASC']],
    transaction,
  })
  const first = await Injection.findOne({ where: { patientId }, order: [['givenOn', 'ASC']], attributes: ['givenOn'], transaction })
  return { results, context: { history: results.map(readingOf), firstInjectionOn: first?.givenOn ?? null } }
}

export function labResultView(result: LabResult, context: LabContext): LabResultView {
  const interpretation = interpretLab(readingOf(result), context)
  const { level, reasons } = evaluateLabTriage(interpretation)
  return {
    id: result.id,
    kind: result.kind,
    takenOn: result.takenOn,
    value: result.value,
    unit: result.unit,
    heartRate: result.heartRate,
    note: result.note,
    enteredBy: result.enteredBy?.name ?? '',
    createdAt: result.createdAt.toISOString(),
    interpretation,
    level,
    reasons,
  }
}

/**
 * Stores one lab or ECG result entered by staff (typed in, or filed from an outside report)
 * inside the caller's transaction. A result the clinic's lab rules put at routine or above
 * opens a triage queue item with it; urgent ones also alert the nurses on duty. It fulfils
 * its check of the monitoring plan (testosterone, PSA, HbA1c, QTc).
 */
export async function recordLabResult(
  input: { patientId: number, enteredBy: Pick<User, 'id'>, result: LabResultInput, clock: ScheduleClock },
  transaction: Transaction,
): Promise<{ result: LabResult, view: LabResultView }> {
  const { result: lab, clock: { settings, now } } = input
  const created = await LabResult.create({
    patientId: input.patientId,
    kind: lab.kind,
    takenOn: lab.takenOn,
    value: lab.value,
    unit: lab.kind === 'testosterone' ? lab.unit : FIXED_UNITS[lab.kind],
    heartRate: lab.kind === 'qtc' ? lab.heartRate : null,
    note: lab.note ?? null,
    enteredByUserId: input.enteredBy.id,
  }, { transaction })
  // The result fulfils its check of the monitoring plan (an older one moves nothing back).
  await fulfilMonitoringItem(input.patientId, FULFILLED_BY_LAB[lab.kind], lab.takenOn, transaction)
  const { results, context } = await labContextOf(input.patientId, transaction)
  const view = labResultView(results.find(r => r.id === created.id)!, context)
  const deadlines = { urgentHours: settings.urgentResponseHours, routineWorkingDays: settings.routineResponseWorkingDays }
  await openTriageItem({ source: 'lab', sourceKey: `lab:${created.id}` }, { patientId: input.patientId, ...view, respondBy: respondBy(view.level, now, deadlines, settings.timeZone), at: now }, transaction)
  return { result: created, view }
}
