import { User } from '../../db/models'

/** The account list for admins (no password hashes leave the server). */
export default defineEventHandler(async (event) => {
  await requireRole(event, ['admin'])
  const users = await User.findAll({ order: [['role', 'ASC'], ['name', 'ASC']] })
  return users.map(u => ({ id: u.id, email: u.email, name: u.name, role: u.role, language: u.language, active: u.active, invited: u.passwordHash === null }))
})
