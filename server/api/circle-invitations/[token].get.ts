import { Patient, User } from '../../db/models'

/**
 * What an invitation link offers, for the page it opens: whose circle, what the caregiver
 * may do, and whether he chooses a password here or signs in first. Only the holder of the
 * link (from the e-mail) can ask; a used, withdrawn or expired link answers 404.
 */
export default defineEventHandler(async (event) => {
  const invitation = await findOpenInvitation(invitationTokenParam(event))
  const [patient, account, inviter, session] = await Promise.all([
    Patient.findByPk(invitation.patientId, { include: [{ model: User, as: 'user' }] }),
    User.findOne({ where: { email: invitation.email } }),
    User.findByPk(invitation.invitedByUserId),
    getUserSession(event),
  ])
  return {
    patientName: patient?.user?.name ?? '',
    caregiverName: account?.name ?? invitation.name,
    email: invitation.email,
    canLogDiary: invitation.canLogDiary,
    canManageAppointments: invitation.canManageAppointments,
    canMessage: invitation.canMessage,
    expiresAt: invitation.expiresAt,
    invitedBy: inviter ? { name: inviter.name, role: inviter.role, onBehalf: inviter.id !== patient?.userId } : null,
    account: invitationAccountKind(account),
    signedInAsInvitee: !!account && session.user?.id === account.id,
  }
})
