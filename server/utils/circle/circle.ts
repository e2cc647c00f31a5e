import type { H3Event } from 'h3'
import { createError, getRouterParam } from 'h3'
import type { Transaction } from 'sequelize'
import type { CareGrant } from '../../db/models'
import { CircleInvitation, OneTimeToken, User } from '../../db/models'
import type { Role } from '#shared/auth/roles'
import { isStaff } from '#shared/auth/roles'

/** A person as the circle pages show him: name and role, and whether staff acted for the patient. */
function personOf(user: User | null | undefined) {
  return user ? { name: user.name, role: user.role as Role, onBehalf: isStaff(user.role) } : null
}

type GrantWithPeople = CareGrant & { caregiver?: User, grantedBy?: User, updatedBy?: User }
type InvitationWithPeople = CircleInvitation & { invitedBy?: User }

export const GRANT_PEOPLE = [
  { model: User, as: 'caregiver' },
  { model: User, as: 'grantedBy' },
  { model: User, as: 'updatedBy' },
]

export function shapeGrant(grant: GrantWithPeople) {
  return {
    id: grant.id,
    caregiver: { id: grant.caregiverUserId, name: grant.caregiver?.name ?? '', email: grant.caregiver?.email ?? '' },
    canLogDiary: grant.canLogDiary,
    canManageAppointments: grant.canManageAppointments,
    canMessage: grant.canMessage,
    since: grant.createdAt,
    grantedBy: personOf(grant.grantedBy),
    changedBy: personOf(grant.updatedBy),
    changedAt: grant.updatedByUserId ? grant.updatedAt : null,
  }
}

export function shapeInvitation(invitation: InvitationWithPeople, now = new Date()) {
  return {
    id: invitation.id,
    name: invitation.name,
    email: invitation.email,
    language: invitation.language,
    canLogDiary: invitation.canLogDiary,
    canManageAppointments: invitation.canManageAppointments,
    canMessage: invitation.canMessage,
    sentAt: invitation.createdAt,
    expiresAt: invitation.expiresAt,
    expired: invitation.expiresAt.getTime() <= now.getTime(),
    invitedBy: personOf(invitation.invitedBy),
  }
}

/** The raw token from the route, or '' (which matches nothing). */
export function invitationTokenParam(event: H3Event): string {
  const raw = getRouterParam(event, 'token') ?? ''
  return /^[\w-]{16,128}$/.test(raw) ? raw : ''
}

/**
 * The pending, unexpired invitation a raw token opens, without spending the token; a
 * dead link answers 404 with the same message whatever the reason.
 */
export async function findOpenInvitation(raw: string, transaction?: Transaction, now = new Date()) {
  const token = raw ? await OneTimeToken.findOne({ where: { tokenHash: hashToken(raw), purpose: 'circle-invite' }, transaction }) : null
  const invitationId = Number(token?.data?.invitationId)
  const invitation = token && isTokenUsable(token, now) && invitationId
    ? await CircleInvitation.findOne({ where: { id: invitationId, status: 'pending' }, transaction })
    : null
  if (!invitation || invitation.expiresAt.getTime() <= now.getTime()) {
    throw createError({ statusCode: 404, message: 'errors.linkInvalid' })
  }
  return invitation
}

/**
 * What accepting means for this e-mail address: 'new' (he chooses a password here, also
 * when staff made his account and he never set one), 'existing' (he signs in first), or
 * 'unavailable' (the address belongs to an account that cannot be a caregiver).
 */
export function invitationAccountKind(account: User | null): 'new' | 'existing' | 'unavailable' {
  if (!account) return 'new'
  if (account.role !== 'caregiver' || !account.active) return 'unavailable'
  return account.passwordHash ? 'existing' : 'new'
}
