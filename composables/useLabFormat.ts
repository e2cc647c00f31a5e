import type { LabKind } from '#shared/labs/lab-triage'

/** Numbers and names for lab results, in the reader's language. */
export function useLabFormat() {
  const { t, n, d } = useI18n()
  return {
    /** A number with at most `digits` decimals. */
    num: (value: number, digits = 1) => n(value, { maximumFractionDigits: digits }),
    kind: (kind: LabKind) => t(`labs.kinds.${kind}`),
    day: (date: string) => d(new Date(`${date}T12:00:00Z`), { key: 'long', timeZone: 'UTC' }),
  }
}
