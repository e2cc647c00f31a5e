import type { Sequelize, Transaction } from 'sequelize'
import { CareGrant, ClinicSetting, Patient, User } from '../models'
import type { Language, Role } from '../../../shared/types/roles'
import { seedDemoLabs } from './labs'
import { seedDemoSchedules } from './schedule'

/**
 * The invented demo clinic, Larkspur Point Urology. Every person here is made up.
 * Seeding runs in steps; each step records itself in clinic_settings and never runs
 * twice, so later features can add steps to an existing demo database.
 */
export const DEMO_PASSWORD = 'tidewell-demo'

interface DemoPerson { email: string, name: string, role: Role, language?: Language }

export const DEMO_STAFF: DemoPerson[] = [
  { email: 'admin@demo.tidewell.test', name: 'Priya Castellanos', role: 'admin' },
  { email: 'nurse@demo.tidewell.test', name: 'Nora Lindqvist', role: 'nurse' },
  { email: 'nurse2@demo.tidewell.test', name: 'Tobias Mwangi', role: 'nurse' },
  { email: 'clinician@demo.tidewell.test', name: 'Ines Varga', role: 'clinician' },
]

export const DEMO_PATIENTS: (DemoPerson & { clinicNumber: string, dateOfBirth: string })[] = [
  { email: 'patient@demo.tidewell.test', name: 'Elias Marwood', role: 'patient', clinicNumber: 'LPU-1001', dateOfBirth: '1951-04-17' },
  { email: 'bernard@demo.tidewell.test', name: 'Bernard Achterberg', role: 'patient', clinicNumber: 'LPU-1002', dateOfBirth: '1948-09-02' },
  { email: 'luis@demo.tidewell.test', name: 'Luis Calderón Ybarra', role: 'patient', language: 'es', clinicNumber: 'LPU-1003', dateOfBirth: '1955-01-23' },
  { email: 'odell@demo.tidewell.test', name: 'Odell Pruitt', role: 'patient', clinicNumber: 'LPU-1004', dateOfBirth: '1946-06-30' },
  { email: 'franklin@demo.tidewell.test', name: 'Franklin Osei-Mensah', role: 'patient', clinicNumber: 'LPU-1005', dateOfBirth: '1953-11-11' },
  { email: 'kenji@demo.tidewell.test', name: 'Kenji Arakawa-Dunn', role: 'patient', clinicNumber: 'LPU-1006', dateOfBirth: '1950-03-08' },
  { email: 'ramon@demo.tidewell.test', name: 'Ramón Espinal Tovar', role: 'patient', language: 'es', clinicNumber: 'LPU-1007', dateOfBirth: '1949-12-14' },
  { email: 'cyril@demo.tidewell.test', name: 'Cyril Hathersage', role: 'patient', clinicNumber: 'LPU-1008', dateOfBirth: '1944-07-19' },
  { email: 'desmond@demo.tidewell.test', name: 'Desmond Laurier', role: 'patient', clinicNumber: 'LPU-1009', dateOfBirth: '1957-05-05' },
  { email: 'augustin@demo.tidewell.test', name: 'Augustín Vela', role: 'patient', language: 'es', clinicNumber: 'LPU-1010', dateOfBirth: '1952-02-27' },
  { email: 'howard@demo.tidewell.test', name: 'Howard Tillinghast', role: 'patient', clinicNumber: 'LPU-1011', dateOfBirth: '1947-10-09' },
  { email: 'mateo@demo.tidewell.test', name: 'Mateo Quiñones Reyes', role: 'patient', language: 'es', clinicNumber: 'LPU-1012', dateOfBirth: '1954-08-21' },
]

export const DEMO_CAREGIVERS: (DemoPerson & { forPatient: string, canLogDiary: boolean, canManageAppointments: boolean })[] = [
  { email: 'caregiver@demo.tidewell.test', name: 'Marisol Marwood', role: 'caregiver', forPatient: 'LPU-1001', canLogDiary: true, canManageAppointments: true },
  { email: 'dana@demo.tidewell.test', name: 'Dana Achterberg', role: 'caregiver', forPatient: 'LPU-1002', canLogDiary: false, canManageAppointments: false },
]

export type SeedStep = (transaction: Transaction) => Promise<void>

const STEPS: [string, SeedStep][] = [
  ['people', async (transaction) => {
    const passwordHash = await hashPassword(DEMO_PASSWORD)
    const admin = await User.create({ ...DEMO_STAFF[0]!, language: 'en', passwordHash }, { transaction })
    for (const person of DEMO_STAFF.slice(1)) {
      await User.create({ ...person, language: person.language ?? 'en', passwordHash }, { transaction })
    }
    for (const person of DEMO_PATIENTS) {
      const user = await User.create({ email: person.email, name: person.name, role: 'patient', language: person.language ?? 'en', passwordHash }, { transaction })
      await Patient.create({ userId: user.id, clinicNumber: person.clinicNumber, dateOfBirth: person.dateOfBirth }, { transaction })
    }
    for (const person of DEMO_CAREGIVERS) {
      const user = await User.create({ email: person.email, name: person.name, role: 'caregiver', language: 'en', passwordHash }, { transaction })
      const patient = await Patient.findOne({ where: { clinicNumber: person.forPatient }, transaction })
      const patientUser = await User.findByPk(patient!.userId, { transaction })
      await CareGrant.create({
        patientId: patient!.id,
        caregiverUserId: user.id,
        grantedByUserId: patientUser?.id ?? admin.id,
        canLogDiary: person.canLogDiary,
        canManageAppointments: person.canManageAppointments,
        revokedAt: null,
      }, { transaction })
    }
    await ClinicSetting.bulkCreate([
      { key: 'nursesOnDuty', value: ['nurse@demo.tidewell.test', 'nurse2@demo.tidewell.test'] },
      { key: 'clinicianAlertList', value: ['clinician@demo.tidewell.test'] },
    ], { transaction, ignoreDuplicates: true })
  }],
  ['schedule', seedDemoSchedules],
  ['labs', seedDemoLabs],
]

/** Runs each step that has not run on this database yet; running it again changes nothing. */
export async function runSeedSteps(sequelize: Sequelize, steps: [string, SeedStep][]) {
  for (const [name, step] of steps) {
    const key = `seed.${name}`
    await sequelize.transaction(async (transaction) => {
      if (await ClinicSetting.findByPk(key, { transaction })) return
      await step(transaction)
      await ClinicSetting.create({ key, value: new Date().toISOString() }, { transaction })
    })
  }
}

/** The demo clinic: people, schedules and results. */
export function seedDemoClinic(sequelize: Sequelize) {
  return runSeedSteps(sequelize, STEPS)
}
