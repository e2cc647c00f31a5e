type InstantFormat = 'dateTime' | 'time' | 'weekday' | 'long' | 'short'

/**
 * Every instant Tidewell shows, in the clinic's time zone: written with that zone given
 * explicitly, never the runtime's default, so the server's page and the browser's hydration
 * write the same string. A time of day is labelled with the zone's name (e.g. "CST") once
 * the page is running in a browser whose own zone is another; that label is added after
 * hydration, so it never makes the two differ.
 */
export function useClinicTime() {
  const { d, locale } = useI18n()
  const { data: clinic } = useClinic()
  const viewerZone = useState<string | null>('viewer-time-zone', () => null)
  if (import.meta.client && getCurrentInstance()) {
    onMounted(() => {
      viewerZone.value = Intl.DateTimeFormat().resolvedOptions().timeZone
    })
  }

  const zone = (timeZone?: string | null) => timeZone || clinic.value.timeZone

  /** The zone's short name at that instant in the reader's language, e.g. "CST", "GMT-6". */
  function zoneName(at: Date, timeZone: string) {
    return new Intl.DateTimeFormat(locale.value, { timeZone, timeZoneName: 'short' })
      .formatToParts(at).find(part => part.type === 'timeZoneName')?.value ?? timeZone
  }

  /** Whether the browser showing the page keeps another zone than `timeZone` (false on the server). */
  const viewerDiffers = (timeZone: string) => viewerZone.value !== null && viewerZone.value !== timeZone

  /**
   * An instant in the clinic's zone. Formats with a time of day get the zone's name when the
   * viewer's zone differs; dates alone ('long', 'short', 'weekday') never do.
   */
  function instant(at: string | Date, key: InstantFormat = 'dateTime', timeZone?: string | null) {
    const date = at instanceof Date ? at : new Date(at)
    const tz = zone(timeZone)
    const text = d(date, { key, timeZone: tz })
    return (key === 'dateTime' || key === 'time') && viewerDiffers(tz) ? `${text} (${zoneName(date, tz)})` : text
  }

  return { instant, zone, zoneName, viewerDiffers }
}
