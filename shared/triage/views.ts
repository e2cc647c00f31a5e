import type { TriageLevel, TriageReason } from './rules'
import type { ScheduleState, SiteCode } from '../schedule/rules'
import type { Disposition, TriageEventType, TriageItemStatus, TriageSource } from './schemas'
import type { Role } from '../auth/roles'
import type { RiskProfile } from './risk-profile'
import type { CaregiverContactView, PatientContactView } from '../contact/views'
import type { DiaryEntryView } from '../diary/views'

/** One row of the triage queue as GET /api/triage returns it (staff only). */
export interface TriageRowView {
  id: number
  reference: string
  patientId: number
  patientName: string
  clinicNumber: string
  source: TriageSource
  level: TriageLevel
  reasons: TriageReason[]
  status: TriageItemStatus
  respondBy: string | null
  overdue: boolean
  escalated: boolean
  assignee: { id: number, name: string } | null
  disposition: Disposition | null
  createdAt: string
}

/** One step in an item's timeline; no actor means Tidewell did it (opened, escalated). */
export interface TriageEventView {
  id: number
  type: TriageEventType
  note: string | null
  data: Record<string, unknown> | null
  at: string
  actor: { id: number, name: string, role: Role } | null
}

/** What the nurse sees of the patient beside the item. */
export interface TriageContextView {
  dateOfBirth: string
  flareWatch: { active: boolean, startsOn: string | null, endsOn: string | null }
  schedule: {
    regimen: { name: string, intervalDays: number, startsOn: string } | null
    lastInjection: { date: string, site: SiteCode, regimenName: string } | null
    daysSinceLastInjection: number | null
    state: ScheduleState
    dueDate: string | null
    daysToDue: number | null
  }
  trend: { id: number, submittedAt: string, level: TriageLevel, hotFlushScore: number, worstPain: number }[]
  openItems: { id: number, reference: string, level: TriageLevel, status: TriageItemStatus, source: TriageSource }[]
}

/** GET /api/triage/:id and the answer of POST /api/triage/:id/events. */
export interface TriageDetailView extends TriageRowView {
  events: TriageEventView[]
  entry: DiaryEntryView | null
  /** The entry's note has been marked read by someone on the care team. */
  noteRead: boolean
  /** A message item: a nurse or clinician has answered in the thread (it may close without an outcome). */
  answered: boolean
  riskProfile: RiskProfile
  /** How to reach him: his phones (tel: links on the page), best times, preference. */
  contact: PatientContactView
  caregivers: CaregiverContactView[]
  context: TriageContextView
  /** For an item a message opened: the conversation it is in (its messages come from GET /api/patients/:id/messages). */
  messageThreadId: number | null
}
