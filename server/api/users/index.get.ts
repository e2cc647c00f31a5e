import { User } from '../../db/models'

/** The account list for admins (no password hashes leave the server); each read is audited. */
export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, ['admin'])
  const users = await User.findAll({ order: [['role', 'ASC'], ['name', 'ASC']] })
  await recordAudit(event, { actor: admin, patientId: null, action: 'users.read', resource: `${event.method} ${event.path}` })
  return users.map(u => ({ id: u.id, email: u.email, name: u.name, role: u.role, language: u.language, active: u.active, invited: u.passwordHash === null }))
})
