import { zonedDateTimeToUtc } from '#shared/schedule/rules'
import { mixGapMinutes } from '#shared/visit/rules'

/**
 * The clinic's clock for the visit's steps, which record times of day ('HH:mm') on the
 * visit's day: the time now in the clinic's zone, and the whole minutes from a kit's mixing
 * to a time the nurse typed (null until the time is a whole HH:mm).
 */
export function useVisitClock() {
  const { data: clinic } = useClinic()
  const clockNow = () => new Intl.DateTimeFormat('en-GB', { timeZone: clinic.value.timeZone, hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(new Date())
  function minutesFromMixing(mixedAt: string, visitDate: string, time: string | undefined): number | null {
    if (!time || !/^([01]\d|2[0-3]):[0-5]\d$/.test(time)) return null
    return mixGapMinutes(new Date(mixedAt), zonedDateTimeToUtc(visitDate, time, clinic.value.timeZone))
  }
  return { clockNow, minutesFromMixing }
}
