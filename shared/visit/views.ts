import type { SiteCode } from '../schedule/rules'
import type { RightNowItem } from '../triage/rules'
import type { KitStatus, NotGivenReason, VisitListState, VisitStatus, WasteReason, WindowCheck } from './rules'

/** What leaves the server about an injection visit. Instants are UTC ISO strings. */

export interface VisitKitView {
  id: number
  regimen: { id: number, name: string }
  gtin: string | null
  lotNumber: string
  lotExpiresOn: string
  powderOk: boolean
  diluentOk: boolean
  inspectedAt: string
  mixedAt: string | null
  status: KitStatus
  wasteReason: WasteReason | null
}

export interface VisitView {
  id: number
  patient: { id: number, name: string, clinicNumber: string, dateOfBirth: string }
  appointmentId: number | null
  visitDate: string
  status: VisitStatus
  openedAt: string
  checks: {
    at: string
    hypersensitivity: boolean
    rightNow: RightNowItem[]
    windowReason: string | null
  } | null
  window: WindowCheck
  regimen: { id: number, name: string, intervalDays: number } | null
  lastInjection: { date: string, site: SiteCode } | null
  suggestedSite: SiteCode
  /** The clinic's limit from mixing to injection, in minutes. */
  mixLimitMinutes: number
  kits: VisitKitView[]
  injection: { id: number, givenAt: string, site: SiteCode, lotNumber: string } | null
  mixGapMinutes: number | null
  notGiven: { reason: NotGivenReason, note: string | null } | null
  observationNote: string | null
  nextAppointmentId: number | null
  /** The next window, once the dose is given (where the next appointment must fall). */
  nextWindow: { opens: string, closes: string, dueDate: string } | null
  triageItemId: number | null
}

/** One line of the day's injection list: an appointment (or a walk-in) and its state. */
export interface VisitListRow {
  patient: { id: number, name: string, clinicNumber: string }
  appointment: { id: number, startsAt: string, place: string } | null
  visitId: number | null
  state: VisitListState
}
