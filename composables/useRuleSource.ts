import { LAB_SOURCES } from '#shared/labs/lab-triage'
import { TRIAGE_SOURCES } from '#shared/triage/rules'

/** Each rule source's text (as stored with a reason) to its locale key, so it reads in the reader's language. */
const KEYS = new Map<string, string>([
  ...Object.entries(TRIAGE_SOURCES).map(([key, text]) => [text, `triage.ruleSources.${key}`] as const),
  ...Object.entries(LAB_SOURCES).map(([key, text]) => [text, `labs.ruleSources.${key}`] as const),
])

/**
 * The source behind a triage or lab rule, in the reader's language. A reason keeps the
 * English source text it was triaged with; text from an older rules version that no longer
 * matches a current source is shown as it was stored.
 */
export function useRuleSource() {
  const { t } = useI18n()
  return (text: string) => {
    const key = KEYS.get(text)
    return key ? t(key) : text
  }
}
