import { riskProfileOf } from '#shared/triage/risk-profile'
import type { RiskProfileView } from '#shared/contact/views'

/** The risk factors that raise his triage (nurses and clinicians). */
export default defineEventHandler(async (event): Promise<RiskProfileView> => {
  const { patient } = await authorizePatient(event, idParam(event), 'risk-profile.manage')
  return { riskProfile: riskProfileOf(patient.riskProfile) }
})
