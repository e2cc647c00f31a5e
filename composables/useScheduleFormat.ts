import type { ScheduleState, SiteCode } from '#shared/schedule/rules'
import type { AppointmentStatus, DueGroup } from '#shared/schedule/statuses'

const camel = (code: string) => code.replace(/-(\w)/g, (_, letter: string) => letter.toUpperCase())

/** The regimens Tidewell ships (DEFAULT_REGIMENS) have names in both languages; a clinic's own keep theirs. */
const DEFAULT_REGIMEN_KEYS: Record<string, string> = {
  '1-month depot': 'oneMonth',
  '3-month depot': 'threeMonth',
  '4-month depot': 'fourMonth',
  '6-month depot': 'sixMonth',
}

/**
 * Words and dates for the injection schedule. Calendar dates (YYYY-MM-DD) keep their day
 * whatever the reader's zone; appointment instants are shown in the clinic's time zone,
 * the same on the server and in the browser.
 */
export function useScheduleFormat() {
  const { t, d, n } = useI18n()
  return {
    /** A calendar date, e.g. "December 8, 2026". */
    day: (date: string, key: 'short' | 'long' | 'weekday' = 'long') => d(new Date(`${date}T12:00:00Z`), { key, timeZone: 'UTC' }),
    /** An instant in the clinic's time zone (the API sends the zone with the data). */
    instant: (iso: string, timeZone: string, key: 'dateTime' | 'time' | 'weekday' | 'long' | 'short' = 'dateTime') =>
      d(new Date(iso), { key, timeZone }),
    /** How often a regimen's injection comes, one way everywhere: in weeks when whole ("every 12 weeks"), else in days. */
    every: (intervalDays: number) => (intervalDays % 7 === 0
      ? t('regimens.everyWeeks', { count: n(intervalDays / 7) }, intervalDays / 7)
      : t('regimens.everyDays', { count: n(intervalDays) }, intervalDays)),
    regimen: (name: string) => (DEFAULT_REGIMEN_KEYS[name] ? t(`regimens.defaultNames.${DEFAULT_REGIMEN_KEYS[name]}`) : name),
    site: (site: SiteCode) => t(`schedule.sites.${camel(site)}`),
    state: (state: ScheduleState) => t(`schedule.states.${camel(state)}`),
    appointmentStatus: (status: AppointmentStatus) => t(`schedule.appointment.statuses.${camel(status)}`),
    group: (group: DueGroup) => t(`dueList.groups.${camel(group)}`),
    groupHelp: (group: DueGroup) => t(`dueList.groupHelp.${camel(group)}`),
    camel,
  }
}
