import type { Sequelize, Transaction } from 'sequelize'
import { CareGrant, ClinicSetting, Patient, User } from '../models'
import type { RiskFactor } from '#shared/triage/risk-profile'
import { riskProfileOf } from '#shared/triage/risk-profile'
import type { ContactPreference, PatientPhone } from '#shared/contact/schemas'
import type { Language, Role } from '#shared/auth/roles'
import { seedDemoLabs } from './labs'
import { seedDemoConversations } from './messages'
import { seedDemoMonitoring } from './monitoring'
import { seedDemoSchedules } from './schedule'

/**
 * The invented demo clinic, Larkspur Point Urology. Every person here is made up.
 * Seeding runs in steps; each step records itself in clinic_settings and never runs
 * twice, so later features can add steps to an existing demo database.
 */
export const DEMO_PASSWORD = 'tidewell-demo'

/**
 * The demo staff come enrolled in the second factor with this one invented secret (Base32,
 * 20 bytes), so the demo still works: `npm run demo` prints it (add it to an authenticator
 * app) and `npm run demo -- --code` prints the current code. Test helpers make codes from it.
 */
export const DEMO_TOTP_SECRET = 'TIDEWELLDEMOSTAFFTOTPSECRETKEY23'

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

export const DEMO_CAREGIVERS: (DemoPerson & { forPatient: string, canLogDiary: boolean, canManageAppointments: boolean, canMessage: boolean })[] = [
  { email: 'caregiver@demo.tidewell.test', name: 'Marisol Marwood', role: 'caregiver', forPatient: 'LPU-1001', canLogDiary: true, canManageAppointments: true, canMessage: true },
  { email: 'dana@demo.tidewell.test', name: 'Dana Achterberg', role: 'caregiver', forPatient: 'LPU-1002', canLogDiary: false, canManageAppointments: false, canMessage: false },
]

/*
 * How the nurses reach each demo patient, all in the fictional 555-0100 to 555-0199 range
 * kept for films and examples; and a risk profile on three of them (the others: none known).
 */
export const DEMO_CONTACTS: Record<string, { phones: PatientPhone[], bestTimes: string, preferred: ContactPreference, risks?: RiskFactor[] }> = {
  'LPU-1001': { phones: [{ label: 'mobile', number: '(312) 555-0142' }, { label: 'home', number: '(312) 555-0143' }], bestTimes: 'Weekday mornings before 11', preferred: 'phone' },
  'LPU-1002': { phones: [{ label: 'home', number: '(414) 555-0118' }], bestTimes: 'Afternoons; his daughter Dana answers when he is resting', preferred: 'caregiver', risks: ['spinalMetastases'] },
  'LPU-1003': { phones: [{ label: 'mobile', number: '(505) 555-0127' }], bestTimes: 'Por la tarde, después de las 3', preferred: 'phone', risks: ['diabetes'] },
  'LPU-1004': { phones: [{ label: 'mobile', number: '(803) 555-0164' }], bestTimes: 'Any time', preferred: 'phone' },
  'LPU-1005': { phones: [{ label: 'mobile', number: '(617) 555-0171' }, { label: 'work', number: '(617) 555-0172' }], bestTimes: 'Lunchtime or after 6 pm', preferred: 'phone' },
  'LPU-1006': { phones: [{ label: 'mobile', number: '(206) 555-0109' }], bestTimes: 'Evenings', preferred: 'email' },
  'LPU-1007': { phones: [{ label: 'home', number: '(915) 555-0135' }], bestTimes: 'Mañanas', preferred: 'phone' },
  'LPU-1008': { phones: [{ label: 'home', number: '(802) 555-0150' }], bestTimes: 'Late morning; he is hard of hearing, let it ring', preferred: 'phone' },
  'LPU-1009': { phones: [{ label: 'mobile', number: '(503) 555-0186' }], bestTimes: 'Weekdays after 4 pm', preferred: 'phone' },
  'LPU-1010': { phones: [{ label: 'mobile', number: '(210) 555-0193' }], bestTimes: 'Mañanas entre semana', preferred: 'phone', risks: ['heartDisease', 'longQt'] },
  'LPU-1011': { phones: [{ label: 'home', number: '(207) 555-0114' }], bestTimes: 'Mornings', preferred: 'phone' },
  'LPU-1012': { phones: [{ label: 'mobile', number: '(305) 555-0158' }], bestTimes: 'Cualquier hora', preferred: 'phone' },
}

export const DEMO_CAREGIVER_PHONES: Record<string, string> = {
  'caregiver@demo.tidewell.test': '(312) 555-0144',
  'dana@demo.tidewell.test': '(414) 555-0119',
}

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
        canMessage: person.canMessage,
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
  ['contacts', async (transaction) => {
    for (const [clinicNumber, contact] of Object.entries(DEMO_CONTACTS)) {
      const risks = Object.fromEntries((contact.risks ?? []).map(factor => [factor, true]))
      await Patient.update({
        phones: contact.phones,
        bestTimesToCall: contact.bestTimes,
        preferredContact: contact.preferred,
        riskProfile: contact.risks ? riskProfileOf(risks) : null,
      }, { where: { clinicNumber }, transaction })
    }
    for (const [email, phone] of Object.entries(DEMO_CAREGIVER_PHONES)) {
      await User.update({ phone }, { where: { email }, transaction })
    }
  }],
  ['second-factor', async (transaction) => {
    for (const person of DEMO_STAFF) {
      await User.update({ totpSecret: encryptSecret(DEMO_TOTP_SECRET), totpEnabledAt: new Date() }, { where: { email: person.email }, transaction })
    }
  }],
  // After the contacts: ECG and electrolytes follow the risk profile.
  ['monitoring', seedDemoMonitoring],
  ['conversations', seedDemoConversations],
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

/** The demo clinic: people, schedules, results and monitoring plans. */
export function seedDemoClinic(sequelize: Sequelize) {
  return runSeedSteps(sequelize, STEPS)
}
