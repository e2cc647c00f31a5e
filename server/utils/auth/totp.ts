import { createCipheriv, createDecipheriv, createHash, randomBytes, randomInt, timingSafeEqual } from 'node:crypto'
import type { H3Event } from 'h3'
import { createError } from 'h3'
import { generateSecret, generateURI, verify } from 'otplib'
import QRCode from 'qrcode'
import { Op } from 'sequelize'
import type { Transaction } from 'sequelize'
import type { User as SessionUser } from '#auth-utils'
import type { Role } from '#shared/auth/roles'
import { Patient, TotpRecoveryCode, User } from '../../db/models'
import { sessionUserOf } from './session-user'
import { progressiveDelayS } from './sign-in-limit'
import { tooManyAttempts } from './throttle'
import { fieldError } from '../core/validation'

/*
 * The second factor (issue 11): TOTP (RFC 6238: SHA-1, 6 digits, 30 s steps, what every
 * authenticator app reads), required for nurses, clinicians and admins, optional for
 * patients and caregivers.
 *
 * - After a right password, a user who needs a second factor gets a half-signed-in session:
 *   no `user` in it, only `secure.secondFactor` (user id and when the password was right;
 *   the secure part never leaves the server). Every data route asks for `session.user`
 *   (requireUserSession / requireActiveUser), so it answers 401 until the code is given.
 *   The half state lasts PENDING_TTL_MS.
 * - Secrets are stored AES-256-GCM encrypted (key: NUXT_TOTP_KEY, or the session password
 *   when that is not set) and never returned once enrolment is confirmed.
 * - A code is accepted once: the time step it matched is kept (totp_last_step) and only a
 *   later step is accepted afterwards (codes from the step before and after now count, for
 *   clocks that drift).
 * - Wrong codes in a row (TOTP or recovery) are counted on the user: 5 free, then each try
 *   waits 30 s after the last wrong one, doubling, at most 15 minutes; a right code clears
 *   the count. Only someone who has the password can get here, so this cannot be used by an
 *   outsider to lock staff out.
 * - Ten recovery codes (10 characters from a 31-letter alphabet, about 50 bits each) are
 *   shown once at enrolment and stored salted SHA-256 (ASVS 2.6.2); each works once.
 */
export const SECOND_FACTOR_ROLES: readonly Role[] = ['nurse', 'clinician', 'admin']
export const PENDING_TTL_MS = 10 * 60 * 1000
export const CODE_THROTTLE = { free: 5, baseS: 30, capS: 15 * 60 }
export const RECOVERY_CODE_COUNT = 10
const ISSUER = 'Tidewell'

export function secondFactorRequired(role: Role): boolean {
  return SECOND_FACTOR_ROLES.includes(role)
}

/** 'verify' when he has a second factor, 'enrol' when his role needs one he has not set up, else null. */
export function secondFactorStage(user: Pick<User, 'role' | 'totpEnabledAt' | 'totpSecret'>): 'verify' | 'enrol' | null {
  if (user.totpEnabledAt && user.totpSecret) return 'verify'
  return secondFactorRequired(user.role) ? 'enrol' : null
}

function encryptionKey(): Buffer {
  const config = useRuntimeConfig()
  const material = String(config.totpKey || config.session?.password || '')
  if (!material) throw new Error('NUXT_TOTP_KEY or NUXT_SESSION_PASSWORD must be set')
  return createHash('sha256').update(`tidewell-totp:${material}`, 'utf8').digest()
}

export function encryptSecret(secret: string): string {
  const iv = randomBytes(12)
  const cipher = createCipheriv('aes-256-gcm', encryptionKey(), iv)
  const body = Buffer.concat([cipher.update(secret, 'utf8'), cipher.final()])
  return ['v1', iv.toString('base64url'), cipher.getAuthTag().toString('base64url'), body.toString('base64url')].join(':')
}

export function decryptSecret(stored: string): string {
  const [version, iv, tag, body] = stored.split(':')
  if (version !== 'v1' || !iv || !tag || !body) throw new Error('unreadable second-factor secret')
  const decipher = createDecipheriv('aes-256-gcm', encryptionKey(), Buffer.from(iv, 'base64url'))
  decipher.setAuthTag(Buffer.from(tag, 'base64url'))
  return Buffer.concat([decipher.update(Buffer.from(body, 'base64url')), decipher.final()]).toString('utf8')
}

/** The time step a code matches (the step before, now or after), or null; steps up to `after` are refused. */
export async function matchCode(secret: string, code: string, after: number | null, epoch = Math.floor(Date.now() / 1000)): Promise<number | null> {
  if (!/^\d{6}$/.test(code)) return null
  try {
    const result = await verify({ secret, token: code, epoch, epochTolerance: 30, ...(after === null ? {} : { afterTimeStep: after }) })
    // otplib's verify is typed as the HOTP or TOTP result; only the TOTP one has timeStep.
    return result.valid && 'timeStep' in result && typeof result.timeStep === 'number' ? result.timeStep : null
  }
  catch {
    // afterTimeStep beyond the window (the last code was from the step after now): nothing left to accept.
    return null
  }
}

/** Seconds to wait before the next code may be tried (0 = now). */
export function codeWaitS(user: Pick<User, 'totpFailures' | 'totpFailedAt'>, now = new Date()): number {
  const failures = user.totpFailures ?? 0
  const delay = progressiveDelayS(failures, CODE_THROTTLE)
  if (!delay || !user.totpFailedAt) return 0
  return Math.max(0, Math.ceil((new Date(user.totpFailedAt).getTime() + delay * 1000 - now.getTime()) / 1000))
}

export function tooManyCodes(event: H3Event, seconds: number) {
  return tooManyAttempts(event, seconds, 'errors.tooManyCodes')
}

export function wrongCode() {
  return fieldError('code', 'validation.code.wrong', 401, 'errors.codeWrong')
}

// Recovery codes: no 0/O, 1/I/L, so they can be read off paper.
const RECOVERY_ALPHABET = 'abcdefghjkmnpqrstuvwxyz23456789'

export function normaliseRecoveryCode(code: string): string {
  return code.toLowerCase().replace(/[\s-]/g, '')
}

function hashRecoveryCode(code: string, salt: string): string {
  return `${salt}:${createHash('sha256').update(`${salt}:${normaliseRecoveryCode(code)}`, 'utf8').digest('hex')}`
}

function recoveryCodeMatches(code: string, stored: string): boolean {
  const [salt] = stored.split(':')
  if (!salt) return false
  const a = Buffer.from(hashRecoveryCode(code, salt))
  const b = Buffer.from(stored)
  return a.length === b.length && timingSafeEqual(a, b)
}

/** Replaces his recovery codes with ten new ones and returns them (shown once). */
export async function newRecoveryCodes(userId: number, transaction: Transaction): Promise<string[]> {
  const codes = Array.from({ length: RECOVERY_CODE_COUNT }, () => {
    const chars = Array.from({ length: 10 }, () => RECOVERY_ALPHABET[randomInt(RECOVERY_ALPHABET.length)]).join('')
    return `${chars.slice(0, 5)}-${chars.slice(5)}`
  })
  await TotpRecoveryCode.destroy({ where: { userId }, transaction })
  await TotpRecoveryCode.bulkCreate(codes.map(code => ({ userId, codeHash: hashRecoveryCode(code, randomBytes(8).toString('hex')), usedAt: null })), { transaction })
  return codes
}

/** Spends one unused recovery code of his; false when none matches. */
async function spendRecoveryCode(userId: number, code: string, transaction: Transaction, now: Date): Promise<boolean> {
  const rows = await TotpRecoveryCode.findAll({ where: { userId, usedAt: { [Op.is]: null } }, transaction })
  const match = rows.find(row => recoveryCodeMatches(code, row.codeHash))
  if (!match) return false
  const [changed] = await TotpRecoveryCode.update({ usedAt: now }, { where: { id: match.id, usedAt: { [Op.is]: null } }, transaction })
  return changed === 1
}

export async function recoveryCodesLeft(userId: number): Promise<number> {
  return TotpRecoveryCode.count({ where: { userId, usedAt: { [Op.is]: null } } })
}

/**
 * Checks a code (a TOTP code, or with `recovery` one recovery code) for a user against the
 * stored secret, or the pending one while enrolling, inside the caller's transaction: the
 * wait after wrong codes, the match, then the count (wrong) or the step and a cleared count
 * (right). Throws 429 while he must wait; returns whether the code was right.
 */
export async function checkCode(event: H3Event, userId: number, input: { code?: string, recoveryCode?: string, pending?: boolean }, transaction: Transaction, now = new Date()): Promise<boolean> {
  const user = await User.findByPk(userId, { transaction })
  if (!user) return false
  const wait = codeWaitS(user, now)
  if (wait) throw tooManyCodes(event, wait)
  let ok = false
  let step: number | null = null
  if (input.recoveryCode && !input.pending) {
    ok = await spendRecoveryCode(user.id, input.recoveryCode, transaction, now)
  }
  else if (input.code) {
    const stored = input.pending ? user.totpPendingSecret : user.totpSecret
    if (stored) {
      step = await matchCode(decryptSecret(stored), input.code, input.pending ? null : user.totpLastStep, Math.floor(now.getTime() / 1000))
      ok = step !== null
    }
  }
  if (ok) {
    await User.update({ totpFailures: 0, totpFailedAt: null, ...(step === null ? {} : { totpLastStep: step }) }, { where: { id: user.id }, transaction })
  }
  else {
    await User.update({ totpFailures: (user.totpFailures ?? 0) + 1, totpFailedAt: now }, { where: { id: user.id }, transaction })
  }
  return ok
}

/** A new secret for the enrolment page, its otpauth:// address and the QR code as an SVG data URL (made here, no outside service). */
export async function enrolmentView(secret: string, email: string) {
  const uri = generateURI({ issuer: ISSUER, label: email, secret })
  const svg = await QRCode.toString(uri, { type: 'svg', errorCorrectionLevel: 'M', margin: 2 })
  return { secret, uri, qr: `data:image/svg+xml;base64,${Buffer.from(svg, 'utf8').toString('base64')}` }
}

export function newTotpSecret(): string {
  return generateSecret({ length: 20 })
}

/**
 * The full session, after the password and (when he needs one) the second factor. The one
 * place a signed-in session is made (sign-in.post.ts and the second-factor routes), with
 * its row in user_sessions (server/utils/auth/sessions.ts).
 */
export async function completeSignIn(event: H3Event, user: User): Promise<SessionUser> {
  const sessionUser = sessionUserOf(user)
  await startSession(event, sessionUser)
  return sessionUser
}

/** The half-signed-in session: the password was right, the code is still to come. */
export async function startSecondFactor(event: H3Event, user: User) {
  await endCurrentSession(event)
  await replaceUserSession(event, { secure: { secondFactor: { userId: user.id, at: Date.now() } } })
}

/** The user of a half-signed-in session, or 401 errors.signedOut when there is none, it is too old or the account is off. */
export async function requirePendingUser(event: H3Event): Promise<User> {
  const session = await getUserSession(event)
  const pending = session.secure?.secondFactor
  if (session.user || !pending || Date.now() - pending.at > PENDING_TTL_MS) {
    throw createError({ statusCode: 401, message: 'errors.signedOut' })
  }
  await useDb()
  const user = await User.findByPk(pending.userId, { include: [{ model: Patient, as: 'patient' }] })
  if (!user || !user.active) {
    await clearUserSession(event)
    throw createError({ statusCode: 401, message: 'errors.signedOut' })
  }
  return user
}

/**
 * Who is enrolling: a half-signed-in user whose role needs a second factor, or a signed-in
 * user (a patient or caregiver turning it on from his account page).
 */
export async function requireEnrollingUser(event: H3Event): Promise<{ user: User, pending: boolean }> {
  const session = await getUserSession(event)
  if (session.user) {
    const signedIn = await requireActiveUser(event)
    const user = await User.findByPk(signedIn.id, { include: [{ model: Patient, as: 'patient' }] })
    if (!user) throw createError({ statusCode: 401, message: 'errors.signedOut' })
    return { user, pending: false }
  }
  return { user: await requirePendingUser(event), pending: true }
}
