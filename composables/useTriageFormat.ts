import type { Disposition, TriageItemStatus, TriageSource } from '#shared/triage/schemas'

const MINUTE = 60_000

/**
 * Words for the triage queue: time left or overdue ("due in 2 h 10 min", "overdue by
 * 35 min"), statuses, sources and outcomes. Instants are shown in the clinic's time zone,
 * so the server and the browser write the same thing.
 */
export function useTriageFormat() {
  const { t } = useI18n()
  const { instant } = useClinicTime()

  /** A span of time in short words: "35 min", "2 h 10 min", "1 d 3 h". */
  function span(milliseconds: number) {
    const minutes = Math.max(1, Math.round(Math.abs(milliseconds) / MINUTE))
    if (minutes < 60) return t('triage.time.minutes', { minutes })
    const hours = Math.floor(minutes / 60)
    if (hours < 24) {
      const rest = minutes % 60
      return rest ? t('triage.time.hoursMinutes', { hours, minutes: rest }) : t('triage.time.hours', { hours })
    }
    const days = Math.floor(hours / 24)
    const restHours = hours % 24
    return restHours ? t('triage.time.daysHours', { days, hours: restHours }) : t('triage.time.days', { days })
  }

  /** Time left before the respond-by time, or how far past it, against `now`. */
  function timeLeft(respondBy: string | null, now: number) {
    if (!respondBy) return t('triage.time.noTarget')
    const left = new Date(respondBy).getTime() - now
    if (Math.abs(left) < MINUTE) return t('triage.time.dueNow')
    return left > 0 ? t('triage.time.dueIn', { time: span(left) }) : t('triage.time.overdueBy', { time: span(left) })
  }

  const isOverdue = (respondBy: string | null, now: number) => respondBy !== null && new Date(respondBy).getTime() < now

  return {
    span,
    timeLeft,
    isOverdue,
    /** An instant in the clinic's zone, labelled with the zone when the reader's own differs (useClinicTime). */
    when: (iso: string, timeZone: string) => instant(iso, 'dateTime', timeZone),
    status: (status: TriageItemStatus) => t(`triage.statuses.${status}`),
    source: (source: TriageSource) => t(`triage.sources.${source}`),
    disposition: (disposition: Disposition) => t(`triage.dispositions.${disposition}`),
  }
}
