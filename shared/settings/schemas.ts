import { z } from 'zod'
import { safeText } from '../common/text'

const email = z.string().trim().toLowerCase().email('validation.email.invalid')
const days = (max: number) => z.number({ invalid_type_error: 'validation.settings.number' }).int('validation.settings.number').min(0, 'validation.settings.range').max(max, 'validation.settings.range')

/** Clinic settings an admin may change (the defaults live in server/utils/core/settings.ts). */
export const clinicSettingsSchema = z.object({
  clinicName: safeText().trim().min(1, 'validation.settings.required').max(120, 'validation.settings.tooLong'),
  timeZone: z.string().refine((zone) => {
    try {
      new Intl.DateTimeFormat('en-US', { timeZone: zone })
      return true
    }
    catch {
      return false
    }
  }, 'validation.settings.timeZone'),
  emergencyNumber: z.string().trim().regex(/^[0-9+ ()-]{2,20}$/, 'validation.settings.phone'),
  crisisLine: z.string().trim().regex(/^[0-9+ ()-]{2,20}$/, 'validation.settings.phone'),
  windowEarlyDays: days(28),
  windowLateDays: days(28),
  flareWatchDays: days(90).min(1, 'validation.settings.range'),
  reminderLeadDays: z.array(days(60).min(1, 'validation.settings.range')).min(1, 'validation.settings.required').max(5, 'validation.settings.range'),
  nursesOnDuty: z.array(email).max(50, 'validation.settings.range'),
  clinicianAlertList: z.array(email).max(50, 'validation.settings.range'),
  urgentResponseHours: days(24).min(1, 'validation.settings.range'),
  emergencyEscalationMinutes: days(240).min(1, 'validation.settings.range'),
  mixToInjectMinutes: days(240).min(1, 'validation.settings.range'),
  routineResponseWorkingDays: days(10).min(1, 'validation.settings.range'),
  // Minutes without a request before a session ends; at most the 8-hour cookie lifetime.
  idleMinutesPatient: days(480).min(5, 'validation.settings.range'),
  idleMinutesStaff: days(480).min(1, 'validation.settings.range'),
}).strict()

export type ClinicSettingsInput = z.infer<typeof clinicSettingsSchema>
