import type { User as SessionUser } from '#auth-utils'
import type { User } from '../../db/models'

/**
 * The session user as every route sees it, built in this one place from the account (and
 * his patient record, when he is a patient): sign-in, the second factor, a new caregiver's
 * first session and the live-session check all hand this shape to the session.
 */
export function sessionUserOf(user: User): SessionUser {
  return { id: user.id, role: user.role, name: user.name, language: user.language, patientId: user.patient?.id ?? null }
}
