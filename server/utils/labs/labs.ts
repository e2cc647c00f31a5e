import type { Transaction } from 'sequelize'
import { evaluateLabTriage, interpretLab } from '#shared/labs/lab-triage'
import type { LabContext, LabReading } from '#shared/labs/lab-triage'
import type { LabResultView } from '#shared/labs/views'
import { Injection, LabResult, User } from '../../db/models'

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
