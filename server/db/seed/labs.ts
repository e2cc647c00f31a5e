import type { Transaction } from 'sequelize'
import { FIXED_UNITS } from '#shared/labs/lab-triage'
import type { LabKind } from '#shared/labs/lab-triage'
import { addDays, localDate } from '#shared/schedule/rules'
import { DEFAULT_SETTINGS } from '../../utils/core/settings'
import { ClinicSetting, LabResult, Patient, User } from '../models'

/*
 * Invented demo lab and ECG results, dated back from the day the demo is seeded. They are
 * written directly, so they open no triage queue item (the demo queue stays as it is):
 * Elias has castrate testosterone values, falling PSA and a normal QTc; Odell a rising PSA
 * (doubling time about six months, not under three); Franklin an HbA1c of 6.8 %.
 */
interface DemoLab { kind: LabKind, daysAgo: number, value: number, unit?: 'ng/dL' | 'nmol/L', heartRate?: number }

const DEMO_LABS: Record<string, DemoLab[]> = {
  'LPU-1001': [
    { kind: 'psa', daysAgo: 330, value: 8.2 },
    { kind: 'qtc', daysAgo: 330, value: 398, heartRate: 68 },
    { kind: 'testosterone', daysAgo: 290, value: 18, unit: 'ng/dL' },
    { kind: 'psa', daysAgo: 250, value: 2.1 },
    { kind: 'testosterone', daysAgo: 170, value: 14, unit: 'ng/dL' },
    { kind: 'psa', daysAgo: 170, value: 0.6 },
    { kind: 'testosterone', daysAgo: 85, value: 0.55, unit: 'nmol/L' },
    { kind: 'psa', daysAgo: 85, value: 0.3 },
  ],
  'LPU-1004': [
    { kind: 'psa', daysAgo: 270, value: 1.2 },
    { kind: 'psa', daysAgo: 180, value: 1.6 },
    { kind: 'psa', daysAgo: 90, value: 2.3 },
    { kind: 'testosterone', daysAgo: 90, value: 22, unit: 'ng/dL' },
    { kind: 'psa', daysAgo: 10, value: 3.1 },
  ],
  'LPU-1005': [
    { kind: 'hba1c', daysAgo: 20, value: 6.8 },
    { kind: 'qtc', daysAgo: 20, value: 410, heartRate: 74 },
  ],
}

/** Today in the demo clinic's time zone: the day the demo dates count back from. */
export async function demoToday(transaction: Transaction): Promise<string> {
  const stored = await ClinicSetting.findByPk('timeZone', { transaction })
  const timeZone = typeof stored?.value === 'string' ? stored.value : DEFAULT_SETTINGS.timeZone
  return localDate(new Date(), timeZone)
}

export async function seedDemoLabs(transaction: Transaction) {
  const today = await demoToday(transaction)
  const nurse = await User.findOne({ where: { role: 'nurse' }, order: [['id', 'ASC']], transaction })
  if (!nurse) return
  for (const [clinicNumber, labs] of Object.entries(DEMO_LABS)) {
    const patient = await Patient.findOne({ where: { clinicNumber }, transaction })
    if (!patient) continue
    await LabResult.bulkCreate(labs.map(lab => ({
      patientId: patient.id,
      kind: lab.kind,
      takenOn: addDays(today, -lab.daysAgo),
      value: lab.value,
      unit: lab.kind === 'testosterone' ? lab.unit ?? 'ng/dL' : FIXED_UNITS[lab.kind],
      heartRate: lab.heartRate ?? null,
      note: null,
      enteredByUserId: nurse.id,
    })), { transaction })
  }
}
