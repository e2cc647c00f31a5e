import { Op } from 'sequelize'
import { circleInviteSchema } from '#shared/circle/schemas'
import { CareGrant, CircleInvitation, User } from '../../../../db/models'

/**
 * Invites a caregiver by e-mail with the permissions the patient chose; staff may do it on
 * his behalf (the invitation, and later the grant, name who sent it). Sending again to the
 * same address replaces the earlier invitation. The same requestId again (a retry, a double
 * click) returns the invitation the first try stored, 200, with no second e-mail. When staff
 * send it, the patient is e-mailed to review his circle.
 */
export default defineEventHandler(async (event) => {
  const { patient, user, relation } = await authorizePatient(event, idParam(event), 'circle.manage')
  const input = await readValidatedBody(event, parseWith(circleInviteSchema))

  const { invitation, created: isNew } = await inDraftTransaction(async (transaction) => {
    if (input.requestId) {
      const first = await CircleInvitation.findOne({ where: { patientId: patient.id, requestId: input.requestId }, transaction })
      if (first) return { invitation: first, created: false }
    }
    // Per patient and per invited address; a retry with a known requestId (above) is not counted.
    await throttle(event, [
      { scope: 'invite:patient', key: `patient:${patient.id}`, ...LIMITS.invitesPerPatient },
      { scope: 'invite:address', key: addressKey(input.email), ...LIMITS.invitesPerAddress },
    ], transaction)
    const account = await User.findOne({ where: { email: input.email }, transaction })
    if (account?.id === patient.userId) {
      throw fieldError('email', 'validation.circle.notYourself')
    }
    const member = account && await CareGrant.findOne({ where: { patientId: patient.id, caregiverUserId: account.id, revokedAt: { [Op.is]: null } }, transaction })
    if (member) {
      throw fieldError('email', 'validation.circle.alreadyMember', 409)
    }
    const now = new Date()
    await CircleInvitation.update({ status: 'cancelled', closedAt: now }, { where: { patientId: patient.id, email: input.email, status: 'pending' }, transaction })
    const created = await CircleInvitation.create({
      patientId: patient.id,
      email: input.email,
      name: input.name,
      language: account?.language ?? input.language,
      canLogDiary: input.canLogDiary,
      canManageAppointments: input.canManageAppointments,
      canMessage: input.canMessage,
      invitedByUserId: user.id,
      expiresAt: new Date(now.getTime() + TOKEN_TTL_MS['circle-invite']),
      acceptedByUserId: null,
      grantId: null,
      closedAt: null,
      requestId: input.requestId ?? null,
    }, { transaction })
    const token = await issueToken({ userId: null, purpose: 'circle-invite', data: { invitationId: created.id } }, transaction, now)
    await enqueueMail({
      ...mailTo(created),
      template: 'circleInvite',
      params: { name: account?.name ?? created.name },
      linkPath: `/circle/accept?token=${token}`,
    }, transaction)
    await noticeCircleChangedByStaff(relation, patient, transaction)
    await recordAudit(event, { actor: user, patientId: patient.id, action: 'circle.invite', resource: `circle-invitation:${created.id}` }, transaction)
    return { invitation: created, created: true }
  })

  setResponseStatus(event, isNew ? 201 : 200)
  return shapeInvitation((await CircleInvitation.findByPk(invitation.id, { include: [{ model: User, as: 'invitedBy' }] }))!)
})
