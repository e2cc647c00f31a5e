import { AsyncLocalStorage } from 'node:async_hooks'
import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import { createError, getRequestHeader } from 'h3'
import { literal, Op } from 'sequelize'
import type { Transaction } from 'sequelize'
import type { User as SessionUser, UserSession as SealedSession } from '#auth-utils'
import { Patient, User, UserSession } from '../../db/models'
import type { SessionEndReason } from '../../db/models/user-session'
import { DEFAULT_SETTINGS } from '../core/settings'

/*
 * Revocable sessions (issue 11). The sealed cookie (nuxt-auth-utils) carries, in its
 * server-only `secure` part, the id of a user_sessions row and when the user was last seen.
 * Every signed-in request (requireActiveUser, and /api/_auth/session through the fetch hook
 * in server/plugins/06.sessions.ts) reads that row together with the user in one query and
 * answers 401 unless it is live and his. Ending the row ends the session everywhere the
 * cookie was copied to.
 *
 * Idle timeout: the last-seen time lives in the cookie, not the database; it is refreshed
 * (a new cookie) at most once a minute, so a request costs no write. Past the clinic's idle
 * limit (patients and caregivers, a shorter one for staff) the row is ended with reason
 * `idle` and the answer is 401 errors.sessionIdle.
 *
 * One check per request from the browser: a server render's internal API calls (and
 * /api/_auth/session) run inside the page request's scope (withSessionScope, set up in
 * server/plugins/06.sessions.ts) and share its check, and the new or cleared cookie goes
 * on the page's response, which is the one the browser keeps.
 */
export const SEEN_REFRESH_MS = 60_000
/** Tests only (NUXT_ALLOW_CLOCK_OVERRIDE): the request is judged as of this ISO time. */
export const CLOCK_HEADER = 'x-tidewell-clock'

/** Now, or with NUXT_ALLOW_CLOCK_OVERRIDE (tests, never production) the time in the clock header. */
export function requestNow(event: H3Event): Date {
  if (useRuntimeConfig(event).allowClockOverride) {
    const stamp = Date.parse(getRequestHeader(event, CLOCK_HEADER) ?? '')
    if (Number.isFinite(stamp)) return new Date(stamp)
  }
  return new Date()
}

export function newSessionId(): string {
  return randomBytes(24).toString('base64url')
}

/**
 * Ends the session this browser holds, if any, before a new sign-in replaces its cookie:
 * otherwise a copy of the old cookie would stay live until it went idle.
 */
export async function endCurrentSession(event: H3Event): Promise<void> {
  const previous = (await getUserSession(event)).secure?.sessionId
  if (previous) await endSession(previous, 'sign-out')
}

/** Signs him in: a new live row, and a fresh cookie that names it (the one it replaces ends). */
export async function startSession(event: H3Event, user: SessionUser): Promise<void> {
  await endCurrentSession(event)
  const id = newSessionId()
  const userAgent = (getRequestHeader(event, 'user-agent') ?? '').slice(0, 120) || null
  await UserSession.create({ id, userId: user.id, endedAt: null, endedReason: null, userAgent })
  const now = Date.now()
  await replaceUserSession(event, { user, loggedInAt: now, secure: { sessionId: id, seenAt: now } })
}

/** Ends one session (if still live). */
export async function endSession(id: string, reason: SessionEndReason, transaction?: Transaction): Promise<void> {
  await UserSession.update({ endedAt: new Date(), endedReason: reason }, { where: { id, endedAt: { [Op.is]: null } }, transaction })
}

/**
 * Ends every live session of a user, or every one but `except` (the session making the
 * change): sign out everywhere, a password change, a deactivation. Returns how many ended.
 */
export async function endSessions(userId: number, reason: SessionEndReason, options: { except?: string | null, transaction?: Transaction } = {}): Promise<number> {
  const [ended] = await UserSession.update({ endedAt: new Date(), endedReason: reason }, {
    where: { userId, endedAt: { [Op.is]: null }, ...(options.except ? { id: { [Op.ne]: options.except } } : {}) },
    transaction: options.transaction,
  })
  return ended
}

/** The idle limit in minutes for a role, from the clinic setting (or its default). */
export function idleMinutesFor(role: string, setting: { patient: unknown, staff: unknown }): number {
  const staff = !['patient', 'caregiver'].includes(role)
  const value = Number(staff ? setting.staff : setting.patient)
  if (Number.isFinite(value) && value > 0) return value
  return staff ? DEFAULT_SETTINGS.idleMinutesStaff : DEFAULT_SETTINGS.idleMinutesPatient
}

interface SessionScope { event: H3Event, checks: Map<string, Promise<User>> }
const scopes = new AsyncLocalStorage<SessionScope>()

/** Runs a request from the browser in its own scope; the internal calls it makes join it. */
export function withSessionScope<T>(event: H3Event, fn: () => T): T {
  return scopes.getStore() ? fn() : scopes.run({ event, checks: new Map() }, fn)
}

async function refuse(event: H3Event, message: 'errors.signedOut' | 'errors.sessionIdle'): Promise<never> {
  await clearUserSession(event)
  throw createError({ statusCode: 401, message })
}

/**
 * The user of a signed-in session whose row is live, his and not idle, read with his
 * patient record and the idle settings in one query; otherwise the cookie is cleared and
 * the answer is 401 (errors.sessionIdle when it ended for idleness, else errors.signedOut).
 */
export function requireLiveSession(event: H3Event, session: SealedSession & { user: SessionUser }): Promise<User> {
  const scope = scopes.getStore()
  const sessionId = session.secure?.sessionId
  if (!scope || !sessionId) return checkSession(event, session)
  let check = scope.checks.get(sessionId)
  if (!check) {
    check = checkSession(scope.event, session)
    scope.checks.set(sessionId, check)
  }
  return check
}

async function checkSession(event: H3Event, session: SealedSession & { user: SessionUser }): Promise<User> {
  const sessionId = session.secure?.sessionId
  if (!sessionId) return refuse(event, 'errors.signedOut')
  await useDb()
  const row = await UserSession.findByPk(sessionId, {
    include: [{ model: User, as: 'user', include: [{ model: Patient, as: 'patient' }] }],
    attributes: {
      include: [
        [literal(`(SELECT value FROM clinic_settings WHERE key = 'idleMinutesPatient')`), 'idlePatient'],
        [literal(`(SELECT value FROM clinic_settings WHERE key = 'idleMinutesStaff')`), 'idleStaff'],
      ],
    },
  })
  const user = row?.user
  if (!row || !user || row.userId !== session.user.id) return refuse(event, 'errors.signedOut')
  if (row.endedAt) return refuse(event, row.endedReason === 'idle' ? 'errors.sessionIdle' : 'errors.signedOut')
  if (!user.active) {
    await endSession(row.id, 'deactivated')
    return refuse(event, 'errors.signedOut')
  }
  const now = requestNow(event).getTime()
  const seenAt = Number(session.secure?.seenAt ?? session.loggedInAt ?? 0)
  const limitMs = idleMinutesFor(user.role, { patient: row.get('idlePatient'), staff: row.get('idleStaff') }) * 60_000
  if (now - seenAt > limitMs) {
    await endSession(row.id, 'idle')
    return refuse(event, 'errors.sessionIdle')
  }
  if (now - seenAt >= SEEN_REFRESH_MS) await setUserSession(event, { secure: { sessionId, seenAt: now } })
  return user
}
