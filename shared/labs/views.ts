import type { LabInterpretation, LabReading } from './lab-triage'
import type { TriageLevel, TriageReason } from '../triage/rules'

/** One lab or ECG result as it leaves the server (the reading as entered), with what it means. */
export interface LabResultView extends LabReading {
  note: string | null
  enteredBy: string
  createdAt: string
  interpretation: LabInterpretation
  /** The level the clinic's lab rules give it, and the rules that fired. */
  level: TriageLevel
  reasons: TriageReason[]
}

export interface LabResultsView {
  /** Today in the clinic's time zone (the form refuses later dates). */
  today: string
  /** Newest first. */
  results: LabResultView[]
}
