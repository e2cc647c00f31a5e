import type { Role } from '../auth/roles'

/**
 * Who made an entry, confirmation or change on a patient's record: the patient himself, a
 * caregiver or clinic staff (the same shape as the diary's EnteredBy, plus the role when
 * known). Shown with components/circle/CircleAttribution.vue, which says nothing for 'self'.
 */
export interface Attribution {
  name: string
  relation: 'self' | 'caregiver' | 'staff'
  role?: Role
}
