import { riskProfileOf } from '#shared/triage/risk-profile'
import { riskProfileSchema } from '#shared/triage/risk-profile-schema'
import type { RiskProfileView } from '#shared/contact/views'

/**
 * Sets his risk profile (nurses and clinicians). Entries from now on are triaged with it;
 * entries already stored keep the triage they got.
 */
export default defineEventHandler(async (event): Promise<RiskProfileView> => {
  const { patient } = await authorizePatient(event, idParam(event), 'risk-profile.manage')
  const riskProfile = await readValidatedBody(event, parseWith(riskProfileSchema))
  await patient.update({ riskProfile })
  return { riskProfile: riskProfileOf(patient.riskProfile) }
})
