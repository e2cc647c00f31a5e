import { z } from 'zod'
import { RISK_FACTORS } from './risk-profile'
import type { RiskProfile } from './risk-profile'

/** PUT /api/patients/:id/risk-profile: every factor answered yes or no (nurses and clinicians). */
export const riskProfileSchema = z.object(
  Object.fromEntries(RISK_FACTORS.map(factor => [factor, z.boolean({ required_error: 'validation.riskProfile.required', invalid_type_error: 'validation.riskProfile.yesNo' })])) as Record<keyof RiskProfile, z.ZodBoolean>,
).strict('validation.riskProfile.unknownField')
