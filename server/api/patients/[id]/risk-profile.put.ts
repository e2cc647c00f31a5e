import { riskProfileOf } from '#shared/clinical/risk-profile'
import { riskProfileSchema } from '#shared/schemas/risk-profile'
import type { RiskProfileView } from '#shared/types/contact'

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
