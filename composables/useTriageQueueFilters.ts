import type { LocationQuery } from 'vue-router'
import { TRIAGE_STATUSES } from '#shared/triage/schemas'
import type { TriageItemStatus } from '#shared/triage/schemas'

export interface TriageQueueFilters {
  level: '' | 'emergency' | 'urgent' | 'routine'
  status: 'open' | 'escalated' | TriageItemStatus
  assignee: 'anyone' | 'me' | 'nobody'
  q: string
}

const LEVEL_FILTERS = ['emergency', 'urgent', 'routine'] as const
const STATUS_FILTERS = ['open', 'escalated', ...TRIAGE_STATUSES] as const
const ASSIGNEE_FILTERS = ['anyone', 'me', 'nobody'] as const

const one = (value: LocationQuery[string] | undefined) => (Array.isArray(value) ? value[0] : value) ?? ''
const pick = <T extends string>(allowed: readonly T[], value: string, fallback: T): T =>
  (allowed as readonly string[]).includes(value) ? value as T : fallback

/**
 * The queue's filters and page live in the address, so a reload or a link keeps them;
 * unknown values fall back to the defaults (open items, anyone, all levels).
 */
export function useTriageQueueFilters() {
  const route = useRoute()
  const filters = computed<TriageQueueFilters>(() => ({
    level: pick(['', ...LEVEL_FILTERS], one(route.query.level), ''),
    status: pick(STATUS_FILTERS, one(route.query.status), 'open'),
    assignee: pick(ASSIGNEE_FILTERS, one(route.query.assignee), 'anyone'),
    q: one(route.query.q).trim().slice(0, 100),
  }))
  const page = computed(() => {
    const value = Number(one(route.query.page))
    return Number.isInteger(value) && value > 0 && value <= 10_000 ? value : 1
  })

  /** The address query for these filters, without the defaults. */
  function toQuery(value: TriageQueueFilters, toPage = 1) {
    return {
      ...(value.level ? { level: value.level } : {}),
      ...(value.status !== 'open' ? { status: value.status } : {}),
      ...(value.assignee !== 'anyone' ? { assignee: value.assignee } : {}),
      ...(value.q ? { q: value.q } : {}),
      ...(toPage > 1 ? { page: String(toPage) } : {}),
    }
  }

  /** The query GET /api/triage expects. */
  const apiQuery = computed(() => ({
    status: filters.value.status,
    assignee: filters.value.assignee,
    page: page.value,
    ...(filters.value.level ? { level: filters.value.level } : {}),
    ...(filters.value.q ? { q: filters.value.q } : {}),
  }))

  const isDefault = computed(() => !filters.value.level && filters.value.status === 'open' && filters.value.assignee === 'anyone' && !filters.value.q)

  return { filters, page, apiQuery, toQuery, isDefault }
}
