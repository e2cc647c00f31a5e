import type { MonitoringDueState, MonitoringKind, MonitoringSourceKey, PlanItem } from './rules'
import type { LabResultView } from '../labs/views'

/** One item of the plan as staff read it: the item as the rules read it, its id and where it stands. */
export interface MonitoringItemView extends PlanItem {
  id: number
  /** Null when the item is not active. */
  dueOn: string | null
  state: MonitoringDueState | null
  /** The newest result of this kind in Tidewell (testosterone, PSA, HbA1c, QTc), with its level. */
  lastResult: LabResultView | null
  /** The sources of this kind's clinic default. */
  sources: MonitoringSourceKey[]
}

export interface MonitoringPlanView {
  patientId: number
  today: string
  /** Null before a plan is made. */
  plan: {
    owner: { id: number, name: string }
    /** The regimen the plan was made or last worked from. */
    regimenName: string | null
    /** His current regimen is not the one the plan was made from: the defaults may be applied again. */
    regimenChanged: boolean
    updatedAt: string
    items: MonitoringItemView[]
  } | null
  /** His current regimen, or null before one is set (defaults need one). */
  regimenName: string | null
  /** Whether the reader may change the plan (its owner or another clinician), and mark checks done. */
  can: { manage: boolean, markDone: boolean }
  /** The clinicians who may own the plan. */
  clinicians: { id: number, name: string }[]
}

/** The patient's and caregiver's view: which checks are coming, in plain words, no values. */
export interface MonitoringDueView {
  today: string
  items: { kind: MonitoringKind, dueOn: string, state: MonitoringDueState }[]
}

/** One line of the clinic-wide list. */
export interface MonitoringDueRow {
  itemId: number
  patientId: number
  name: string
  clinicNumber: string
  kind: MonitoringKind
  dueOn: string
  state: Exclude<MonitoringDueState, 'later'>
  lastDoneOn: string | null
}

export interface MonitoringDueListView {
  today: string
  rows: MonitoringDueRow[]
}
