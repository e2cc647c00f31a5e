import type { Transaction } from 'sequelize'
import { ClinicSetting } from '../../db/models'

/**
 * Clinic settings with their defaults. The defaults are the demo clinic's and common
 * practice; the clinic's licensed clinicians review and change them (admin settings page).
 */
export const DEFAULT_SETTINGS = {
  clinicName: 'Larkspur Point Urology',
  timeZone: 'America/Chicago',
  emergencyNumber: '911',
  crisisLine: '988',
  windowEarlyDays: 7,
  windowLateDays: 7,
  flareWatchDays: 28,
  reminderLeadDays: [7, 1] as number[],
  nursesOnDuty: [] as string[],
  clinicianAlertList: [] as string[],
  urgentResponseHours: 4,
  // An emergency item still new this many minutes after it opened goes on to the clinicians
  // (the patient was told to call the emergency number at once; this is the clinic's own
  // follow-up). Common practice, no published figure.
  emergencyEscalationMinutes: 15,
  // The depot suspension is to be given right after mixing (prescribing information, section
  // 2; from memory): past this many minutes from mixing to injection the visit warns and asks
  // the nurse to confirm. The number is the clinic's to set (common practice, no source).
  mixToInjectMinutes: 30,
  routineResponseWorkingDays: 3,
  // Sign-out after this many minutes without a request (server/utils/auth/sessions.ts). Common
  // practice, not a rule: about an hour on a patient's own device, 15 minutes on shared
  // clinic workstations (as health-record access policies usually ask of staff).
  idleMinutesPatient: 60,
  idleMinutesStaff: 15,
}

export type ClinicSettings = typeof DEFAULT_SETTINGS

/**
 * The settings now. Inside a transaction pass it: a query outside it waits for any other
 * write on the shared connection, which may itself wait for this transaction (a stall
 * until the busy timeout).
 */
export async function getSettings(transaction?: Transaction): Promise<ClinicSettings> {
  await useDb()
  const rows = await ClinicSetting.findAll({ transaction })
  const stored = Object.fromEntries(rows.filter(row => row.key in DEFAULT_SETTINGS).map(row => [row.key, row.value]))
  return { ...DEFAULT_SETTINGS, ...stored } as ClinicSettings
}
