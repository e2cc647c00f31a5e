import type { MonitoringDueState, MonitoringKind, MonitoringSourceKey } from '#shared/monitoring/rules'

/** Words for the monitoring plan, in the reader's language. */
export function useMonitoringFormat() {
  const { t } = useI18n()
  return {
    kind: (kind: MonitoringKind) => t(`monitoring.kinds.${kind}`),
    plainKind: (kind: MonitoringKind) => t(`monitoring.plain.kinds.${kind}`),
    state: (state: MonitoringDueState) => t(`monitoring.states.${state}`),
    source: (source: MonitoringSourceKey) => t(`monitoring.sources.${source}`),
    /** Options of a <select> of checks. */
    kindOptions: (kinds: readonly MonitoringKind[]) => kinds.map(kind => ({ value: kind, label: t(`monitoring.kinds.${kind}`) })),
  }
}
