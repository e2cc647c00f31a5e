import type { TriageLevel, TriageReason } from '../triage/rules'
import type { DiaryEntryInput } from './schemas'
import type { Disposition, TriageItemStatus } from '../triage/schemas'

/** Who made an entry or a change: the patient himself, a caregiver, or clinic staff. */
export interface EnteredBy {
  name: string
  relation: 'self' | 'caregiver' | 'staff'
}

/** A diary entry as the API returns it. */
export interface DiaryEntryView {
  id: number
  patientId: number
  submittedAt: string
  /** False while only a right-now report has arrived (the rest of the diary may follow). */
  complete: boolean
  level: TriageLevel
  reasons: TriageReason[]
  respondBy: string | null
  noteFlagged: boolean
  flareWatchActive: boolean
  /** The triage rules version that worked out this level. */
  rulesVersion: string
  hotFlushScore: number
  worstPain: number
  answers: DiaryEntryInput
  enteredBy: EnteredBy
  /** The care team's review when the entry opened a triage queue item. */
  review?: { status: TriageItemStatus, disposition: Disposition | null, closedAt: string | null } | null
}
