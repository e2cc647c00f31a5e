import { User } from '../../db/models'
import type { Attribution } from '#shared/common/attribution'

/**
 * Who made each row on a patient's record, in one query for a whole list: give it the
 * patient's own user id and the user id stored on every row (enteredByUserId,
 * confirmedByUserId…); the lookup answers { name, relation, role }, or null for no one.
 *
 *   const by = await attributionLookup(patient.userId, rows.map(r => r.confirmedByUserId))
 *   rows.map(r => ({ ...shape(r), confirmedBy: by(r.confirmedByUserId) }))
 */
export async function attributionLookup(
  patientUserId: number,
  userIds: readonly (number | null | undefined)[],
): Promise<(userId: number | null | undefined) => Attribution | null> {
  const ids = [...new Set(userIds.filter((id): id is number => typeof id === 'number'))]
  const users = ids.length ? await User.findAll({ where: { id: ids }, attributes: ['id', 'name', 'role'] }) : []
  const byId = new Map(users.map(u => [u.id, attributionOf(u, patientUserId)]))
  return userId => (typeof userId === 'number' ? byId.get(userId) ?? null : null)
}

/** One person's attribution on one patient's record. */
export function attributionOf(user: Pick<User, 'id' | 'name' | 'role'>, patientUserId: number): Attribution {
  const relation = user.id === patientUserId ? 'self' : user.role === 'caregiver' ? 'caregiver' : 'staff'
  return { name: user.name, relation, role: user.role }
}
