/*
 * The risk profile on a patient's record, set by nurses and clinicians. Like the flare
 * watch, each factor ranks the symptoms related to it one step higher in triage (see the
 * risk raise rules in triage.ts). The prescribing information of the GnRH-agonist depots
 * asks that men with vertebral metastases or urinary tract obstruction be watched closely
 * in the first weeks (Warnings, tumour flare); the other links are common practice.
 */
export const RISK_FACTORS = [
  'spinalMetastases',
  'urinaryObstruction',
  'diabetes',
  'heartDisease',
  'longQt',
  'seizures',
  'chemotherapy',
] as const
export type RiskFactor = (typeof RISK_FACTORS)[number]

export type RiskProfile = Record<RiskFactor, boolean>

export function emptyRiskProfile(): RiskProfile {
  return Object.fromEntries(RISK_FACTORS.map(factor => [factor, false])) as RiskProfile
}

/** A stored profile (possibly older, with fewer factors) read with every factor present. */
export function riskProfileOf(stored: unknown): RiskProfile {
  const profile = emptyRiskProfile()
  if (!stored || typeof stored !== 'object') return profile
  for (const factor of RISK_FACTORS) profile[factor] = (stored as Record<string, unknown>)[factor] === true
  return profile
}
