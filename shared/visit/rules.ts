import { daysBetween } from '../schedule/rules'
import type { ScheduleStatus } from '../schedule/rules'
import { TRIAGE_SOURCES } from '../triage/rules'
import type { TriageReason } from '../triage/rules'

/*
 * The injection visit, as data and small pure checks: where the visit stands, why a kit is
 * wasted or a dose not given, how the day falls against the window, and the time from
 * mixing to injection.
 *
 * Sources: the GnRH-agonist depot prescribing information (US, sections 2 Dosage and
 * administration, 4 Contraindications; from memory for the wording): a single intramuscular
 * injection of the whole kit, never split and never made of two kits; the suspension given
 * right after mixing; hypersensitivity to a GnRH agonist or to the product's other
 * ingredients contraindicates it. The window is the clinic's setting (see schedule/rules.ts).
 * The checklist's order and the reasons are common nursing practice.
 */

/** Where a visit stands: here (in the room), given, not given, or stopped before the kit. */
export const VISIT_STATUSES = ['here', 'given', 'not-given', 'stopped'] as const
export type VisitStatus = (typeof VISIT_STATUSES)[number]

/** Why the dose was not given today. */
export const NOT_GIVEN_REASONS = ['blood-on-aspiration', 'kit-defect', 'declined', 'unwell'] as const
export type NotGivenReason = (typeof NOT_GIVEN_REASONS)[number]

/** Why a kit was thrown away: it never counts as an injection and never moves the schedule. */
export const WASTE_REASONS = ['blood-on-aspiration', 'kit-defect', 'not-given'] as const
export type WasteReason = (typeof WASTE_REASONS)[number]

/** Where a kit stands: prepared (checked), mixed, given, or wasted. */
export const KIT_STATUSES = ['prepared', 'mixed', 'given', 'wasted'] as const
export type KitStatus = (typeof KIT_STATUSES)[number]

/** The state of a day's appointment on the injection list. */
export const VISIT_LIST_STATES = ['expected', 'here', 'given', 'not-given'] as const
export type VisitListState = (typeof VISIT_LIST_STATES)[number]

export function listStateOf(visit: { status: VisitStatus } | null): VisitListState {
  if (!visit) return 'expected'
  return visit.status === 'here' ? 'here' : visit.status === 'given' ? 'given' : 'not-given'
}

/**
 * How today falls against the window: inside it (or not started: the first dose has no
 * window), too early by `days` before it opens, or too late by `days` after it closed.
 * `daysFromDue` is negative before the due date.
 */
export type WindowCheck =
  | { position: 'inside' | 'first-dose', daysFromDue: number | null }
  | { position: 'early' | 'late', days: number, daysFromDue: number }

export function windowCheck(schedule: Pick<ScheduleStatus, 'dueDate' | 'windowOpens' | 'windowCloses'>, today: string): WindowCheck {
  const { dueDate, windowOpens, windowCloses } = schedule
  if (!dueDate || !windowOpens || !windowCloses) return { position: 'first-dose', daysFromDue: null }
  const daysFromDue = daysBetween(dueDate, today)
  if (today < windowOpens) return { position: 'early', days: daysBetween(today, windowOpens), daysFromDue }
  if (today > windowCloses) return { position: 'late', days: daysBetween(windowCloses, today), daysFromDue }
  return { position: 'inside', daysFromDue }
}

/** Whole minutes from mixing to injection (never below 0). */
export function mixGapMinutes(mixedAt: Date, givenAt: Date): number {
  return Math.max(0, Math.floor((givenAt.getTime() - mixedAt.getTime()) / 60_000))
}

/**
 * A known hypersensitivity stops the visit before any kit is opened: the dose is
 * contraindicated (prescribing information, Contraindications). It opens an urgent queue
 * item for the clinician who owns his plan.
 */
export const HYPERSENSITIVITY_REASON: TriageReason = {
  rule: 'visit-hypersensitivity',
  level: 'urgent',
  reasonKey: 'visit.reasons.hypersensitivity',
  instructionKey: 'visit.reasons.hypersensitivityInstruction',
  source: TRIAGE_SOURCES.contraindication,
}
