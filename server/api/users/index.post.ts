import { UniqueConstraintError } from 'sequelize'
import { createUserSchema } from '#shared/auth/schemas'
import type { Role } from '#shared/auth/roles'
import { Patient, User } from '../../db/models'

/** Which roles each staff role may create: only an admin creates another admin. */
const MAY_CREATE: Partial<Record<Role, Role[]>> = {
  admin: ['patient', 'caregiver', 'nurse', 'clinician', 'admin'],
  // A nurse registers the people she cares for; staff accounts are an admin's to make.
  nurse: ['patient', 'caregiver'],
}

/** Staff create an account; the person gets an invitation e-mail to set a password (72 h). */
export default defineEventHandler(async (event) => {
  const actor = await requireRole(event, ['admin', 'nurse'])
  const input = await readValidatedBody(event, parseWith(createUserSchema))
  if (!MAY_CREATE[actor.role]?.includes(input.role)) throw createError({ statusCode: 403, message: 'errors.forbidden' })

  const sequelize = await useDb()
  try {
    const created = await sequelize.transaction(async (transaction) => {
      const user = await User.create({ email: input.email, name: input.name, role: input.role, language: input.language, passwordHash: null }, { transaction })
      const patient = input.patient
        ? await Patient.create({ userId: user.id, clinicNumber: input.patient.clinicNumber, dateOfBirth: input.patient.dateOfBirth }, { transaction })
        : null
      const token = await issueToken({ userId: user.id, purpose: 'invite' }, transaction)
      await enqueueMail({
        ...mailTo(user),
        template: 'invite',
        params: { name: user.name, inviter: actor.name },
        linkPath: `/set-password?token=${token}&welcome=1`,
      }, transaction)
      await recordAudit(event, { actor, patientId: patient?.id ?? null, action: 'user.create', resource: `user:${user.id}` }, transaction)
      return { id: user.id, email: user.email, name: user.name, role: user.role, language: user.language, patientId: patient?.id ?? null }
    })
    setResponseStatus(event, 201)
    return created
  }
  catch (error) {
    if (error instanceof UniqueConstraintError) {
      const field = error.errors[0]?.path === 'clinic_number' ? 'patient.clinicNumber' : 'email'
      throw fieldError(field, 'validation.alreadyExists', 409)
    }
    throw error
  }
})
