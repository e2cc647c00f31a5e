import type { RiskProfile } from '../triage/risk-profile'
import type { ContactPreference, PatientPhone } from './schemas'

/** How the care team reaches him: GET /api/patients/:id/contact and the triage item. */
export interface PatientContactView {
  phones: PatientPhone[]
  bestTimes: string
  preferred: ContactPreference
}

/** A caregiver in his circle with the caregiver's own phone (null when none is given). */
export interface CaregiverContactView {
  name: string
  phone: string | null
}

/** GET /api/patients/:id/risk-profile (nurses and clinicians). */
export interface RiskProfileView {
  riskProfile: RiskProfile
}
