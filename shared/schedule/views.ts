import type { ScheduleState, SiteCode } from './rules'
import type { AppointmentStatus, ChangeDecision, ChangeRequestKind, DueGroup } from './statuses'
import type { Attribution } from '../common/attribution'

/** What leaves the server about the injection schedule (no internal columns). */

export interface ChangeRequestView {
  id: number
  /** Another time (with preferred dates), or to cancel (none). */
  kind: ChangeRequestKind
  preferredDates: string[]
  note: string | null
  createdAt: string
  /** Who asked: the patient himself, a caregiver or staff (relation says which). */
  requestedBy: Attribution | null
}

export interface ChangeAnswerView {
  decision: ChangeDecision | 'cancel'
  note: string | null
  answeredAt: string
  answeredBy: string
}

export interface AppointmentView {
  id: number
  /** UTC instants; shown in the clinic's time zone. */
  startsAt: string
  endsAt: string
  /** The same start as a calendar date and clock time in the clinic's time zone. */
  localDate: string
  localTime: string
  durationMinutes: number
  place: string
  status: AppointmentStatus
  confirmedAt: string | null
  confirmedBy: Attribution | null
  openRequest: ChangeRequestView | null
  lastAnswer: ChangeAnswerView | null
}

export interface CancelledAppointmentView {
  id: number
  localDate: string
  localTime: string
  reason: string | null
  cancelledAt: string
}

export interface ScheduleView {
  patientId: number
  /** Today in the clinic's time zone, and that zone. */
  today: string
  timeZone: string
  regimen: { id: number, name: string, intervalDays: number, startsOn: string } | null
  lastInjection: { date: string, site: SiteCode, regimenName: string } | null
  state: ScheduleState
  dueDate: string | null
  windowOpens: string | null
  windowCloses: string | null
  daysToDue: number | null
  suggestedSite: SiteCode
  flareWatch: { active: boolean, startsOn: string | null, endsOn: string | null }
  nextAppointment: AppointmentView | null
  /**
   * When he has no open appointment: the last one the clinic cancelled in the past 30 days,
   * with its reason, so Today tells him why and that his injection is still due.
   */
  lastCancelled: CancelledAppointmentView | null
  /** What the person asking may do here. */
  can: { respond: boolean, schedule: boolean, record: boolean }
}

export interface InjectionView {
  id: number
  givenAt: string
  givenOn: string
  site: SiteCode
  lotNumber: string
  lotExpiresOn: string
  regimen: { id: number, name: string }
  givenBy: string
  note: string | null
}

export interface DueListRow {
  patientId: number
  name: string
  clinicNumber: string
  regimenName: string | null
  lastInjectionOn: string | null
  dueDate: string | null
  windowOpens: string | null
  windowCloses: string | null
  daysToDue: number | null
  state: ScheduleState
  group: DueGroup
  nextAppointment: { id: number, startsAt: string, status: AppointmentStatus } | null
}

/** One open request for another time on the clinic-wide list. */
export interface ChangeRequestListRow {
  id: number
  kind: ChangeRequestKind
  patient: { id: number, name: string, clinicNumber: string }
  appointment: { id: number, startsAt: string, place: string }
  preferredDates: string[]
  note: string | null
  createdAt: string
  requestedBy: Attribution | null
}
