import type { RiskProfile } from '#shared/triage/risk-profile'
import type { diaryEntryWith } from '#shared/diary/schemas'

/*
 * A clinical vignette: one realistic man and his diary entry, with the LOWEST level a
 * careful clinician would accept for it and the source of that floor. The cases are
 * written from the published sources (../shared/REFERENCES.md and the ones named in each
 * case), never from the triage rules, so they can disagree with the engine. Where a
 * source gives no threshold the case says "common practice" and takes a conservative,
 * defensible floor; a number recalled rather than looked up says "from memory".
 *
 * Levels, lowest first. This order is the suite's own (not the engine's compareLevels),
 * so a change to the engine's ordering cannot move the expectations.
 */
export const LEVEL_ORDER = ['none', 'routine', 'urgent', 'emergency'] as const
export type Level = (typeof LEVEL_ORDER)[number]

export const rank = (level: string): number => {
  const index = (LEVEL_ORDER as readonly string[]).indexOf(level)
  if (index < 0) throw new Error(`Unknown triage level ${JSON.stringify(level)}`)
  return index
}

/** The sections a case changes; everything else stays the all-no entry (diaryEntryWith). */
export type Changes = Parameters<typeof diaryEntryWith>[0]

/** One sign of a combination, evaluated alone in the same context, with its own floor. */
export interface VignettePart {
  label: string
  entry: Changes
  minimum: Level
}

export interface Vignette {
  /** Short stable id, e.g. "PAIN-07". */
  id: string
  /** The man, in a line: age, regimen, where he is in his treatment, what he reports. */
  story: string
  entry: Changes
  /** In the first weeks after his first injection. */
  flareWatch?: boolean
  /** His previous complete entries, most recent first. */
  baseline?: Changes[]
  /** Factors set true on his record; the others are false. */
  risk?: Partial<RiskProfile>
  /** The lowest acceptable level: anything lower is under-triage and fails. */
  minimum: Level
  /** Where the floor comes from. */
  source: string
  /** Why this floor, where the source leaves room for judgement. */
  why?: string
  /**
   * For a combination: the signs alone. Each part must meet its own floor, the
   * combination must rank at least as high as every part does in the engine, and the
   * combination's floor is above every part's (checked as a property of the suite).
   */
  parts?: VignettePart[]
}

/** A negative control: a case that must give exactly this level (over-triage fails here). */
export interface Control {
  id: string
  story: string
  entry: Changes
  flareWatch?: boolean
  baseline?: Changes[]
  risk?: Partial<RiskProfile>
  /** Pass no risk profile at all (an older record). */
  noRiskProfile?: boolean
  exactly: Level
  source: string
}
