export const ROLES = ['patient', 'caregiver', 'nurse', 'clinician', 'admin'] as const
export type Role = (typeof ROLES)[number]

export const STAFF_ROLES = ['nurse', 'clinician', 'admin'] as const satisfies readonly Role[]
export type StaffRole = (typeof STAFF_ROLES)[number]

export const LANGUAGES = ['en', 'es'] as const
export type Language = (typeof LANGUAGES)[number]

export function isStaff(role: Role): role is StaffRole {
  return (STAFF_ROLES as readonly Role[]).includes(role)
}

/** Where each role lands after signing in: nurses and clinicians start at the triage queue. */
export const HOME_BY_ROLE: Record<Role, string> = {
  patient: '/today',
  caregiver: '/today',
  nurse: '/staff/triage',
  clinician: '/staff/triage',
  admin: '/admin',
}
