import { forgotPasswordSchema } from '../../../shared/schemas/auth'
import { User } from '../../db/models'

/** Always the same answer, whether or not the e-mail belongs to an account. */
export default defineEventHandler(async (event) => {
  const { email } = await readValidatedBody(event, parseWith(forgotPasswordSchema))
  const sequelize = await useDb()
  const user = await User.findOne({ where: { email, active: true } })
  if (user) {
    await sequelize.transaction(async (transaction) => {
      const token = await issueToken({ userId: user.id, purpose: 'reset' }, transaction)
      await enqueueMail({
        to: user.email,
        template: 'reset',
        language: user.language,
        params: { name: user.name },
        linkPath: `/set-password?token=${token}`,
      }, transaction)
    })
  }
  setResponseStatus(event, 202)
  return { ok: true }
})
