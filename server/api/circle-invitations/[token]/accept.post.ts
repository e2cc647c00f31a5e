import { Op } from 'sequelize'
import { acceptInvitationSchema } from '#shared/circle/schemas'
import { CareGrant, CircleInvitation, User } from '../../../db/models'

/**
 * Accepts a care-circle invitation; the link works once. Someone new to Tidewell chooses a
 * password here and is signed in (the link proves the address is his); someone who already
 * has a caregiver account must be signed in as that account, and the patient joins his list.
 */
export default defineEventHandler(async (event) => {
  const raw = invitationTokenParam(event)
  const input = await readValidatedBody(event, parseWith(acceptInvitationSchema))
  await throttle(event, [{ scope: 'set-password:ip', key: `ip:${clientIp(event)}`, ...LIMITS.setPasswordPerIp }])
  // The password may not be the invited address or name (read here, the link is not spent).
  await useDb()
  const invited = input.password === undefined ? null : await findOpenInvitation(raw)
  const problems = invited ? await passwordProblemsFor(input.password!, { email: invited.email, name: input.name ?? invited.name }) : []
  if (problems.length) throw fieldError('password', problems, 400, problems[0])
  const passwordHash = input.password === undefined ? null : await hashPassword(input.password)
  // Who is signed in, from a live session only: an ended or idle cookie is nobody here.
  const signedInId = (await getUserSession(event)).user
    ? await requireActiveUser(event).then(user => user.id, (error: { statusCode?: number }) => {
      if (error?.statusCode === 401) return null
      throw error
    })
    : null

  const sequelize = await useDb()
  const accepted = await sequelize.transaction(async (transaction) => {
    const invitation = await findOpenInvitation(raw, transaction)
    let account = await User.findOne({ where: { email: invitation.email }, transaction })
    const kind = invitationAccountKind(account)
    if (kind === 'unavailable') throw createError({ statusCode: 409, message: 'errors.circleAccountUnavailable' })
    if (kind === 'existing' && signedInId !== account!.id) {
      throw createError({ statusCode: 403, message: 'errors.circleSignInFirst' })
    }
    if (kind === 'new') {
      if (!passwordHash) {
        throw fieldError('password', 'validation.password.tooShort')
      }
      const name = input.name ?? invitation.name
      account = account
        ? await account.update({ name, passwordHash }, { transaction })
        : await User.create({ email: invitation.email, name, role: 'caregiver', language: invitation.language, passwordHash }, { transaction })
    }
    if (!await consumeToken(raw, ['circle-invite'], transaction)) throw createError({ statusCode: 404, message: 'errors.linkInvalid' })

    const flags = { canLogDiary: invitation.canLogDiary, canManageAppointments: invitation.canManageAppointments, canMessage: invitation.canMessage }
    const current = await CareGrant.findOne({ where: { patientId: invitation.patientId, caregiverUserId: account!.id, revokedAt: { [Op.is]: null } }, transaction })
    const grant = current
      ? await current.update({ ...flags, updatedByUserId: invitation.invitedByUserId }, { transaction })
      : await CareGrant.create({ patientId: invitation.patientId, caregiverUserId: account!.id, grantedByUserId: invitation.invitedByUserId, ...flags, revokedAt: null }, { transaction })
    await CircleInvitation.update(
      { status: 'accepted', acceptedByUserId: account!.id, grantId: grant.id, closedAt: new Date() },
      { where: { id: invitation.id }, transaction },
    )
    await recordAudit(event, { actor: account, patientId: invitation.patientId, action: 'circle.accept', resource: `care-grant:${grant.id}` }, transaction)
    return { account: account!, patientId: invitation.patientId, newAccount: kind === 'new' }
  })

  if (accepted.newAccount) {
    await startSession(event, sessionUserOf(accepted.account))
  }
  return { patientId: Number(accepted.patientId), newAccount: accepted.newAccount }
})
