import type { LabInterpretation, LabKind } from './lab-triage'
import type { TriageLevel, TriageReason } from '../triage/rules'

/** One lab or ECG result as it leaves the server, with what it means. */
export interface LabResultView {
  id: number
  kind: LabKind
  takenOn: string
  /** As entered: testosterone in its unit, PSA ng/mL, HbA1c %, QT ms (QTc). */
  value: number
  unit: string
  heartRate: number | null
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
