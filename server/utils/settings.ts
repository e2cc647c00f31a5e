import { ClinicSetting } from '../db/models'

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
  routineResponseWorkingDays: 3,
}

export type ClinicSettings = typeof DEFAULT_SETTINGS

export async function getSettings(): Promise<ClinicSettings> {
  await useDb()
  const rows = await ClinicSetting.findAll()
  const stored = Object.fromEntries(rows.filter(row => row.key in DEFAULT_SETTINGS).map(row => [row.key, row.value]))
  return { ...DEFAULT_SETTINGS, ...stored } as ClinicSettings
}
