import { createHash, randomBytes } from 'node:crypto'
import { Op } from 'sequelize'
import type { Transaction } from 'sequelize'
import { OneTimeToken } from '../../db/models'
import type { TokenPurpose } from '../../db/models/one-time-token'

export const TOKEN_TTL_MS: Record<TokenPurpose, number> = {
  'invite': 72 * 60 * 60 * 1000,
  'reset': 60 * 60 * 1000,
  'circle-invite': 72 * 60 * 60 * 1000,
}

/** SHA-256 of the raw token; the raw token only ever travels in the e-mail link. */
export function hashToken(raw: string): string {
  return createHash('sha256').update(raw, 'utf8').digest('hex')
}

export function newRawToken(): string {
  return randomBytes(32).toString('base64url')
}

export function isTokenUsable(token: { expiresAt: Date, usedAt: Date | null }, now: Date): boolean {
  return token.usedAt === null && token.expiresAt.getTime() > now.getTime()
}

export async function issueToken(
  input: { userId: number | null, purpose: TokenPurpose, data?: Record<string, unknown> },
  transaction: Transaction,
  now = new Date(),
): Promise<string> {
  const raw = newRawToken()
  await OneTimeToken.create({
    userId: input.userId,
    purpose: input.purpose,
    tokenHash: hashToken(raw),
    data: input.data ?? {},
    expiresAt: new Date(now.getTime() + TOKEN_TTL_MS[input.purpose]),
    usedAt: null,
  }, { transaction })
  return raw
}

/**
 * Marks a token used and returns it, or null when it is unknown, spent, expired or for
 * another purpose. The conditional UPDATE makes a second use lose even in a race. Using
 * one link spends every other outstanding link of the same purposes for the same user
 * (three reset e-mails: the newest used, the two older ones then answer "used or expired").
 */
export async function consumeToken(raw: string, purposes: TokenPurpose[], transaction: Transaction, now = new Date()) {
  const token = await OneTimeToken.findOne({ where: { tokenHash: hashToken(raw), purpose: purposes }, transaction })
  if (!token || !isTokenUsable(token, now)) return null
  const [changed] = await OneTimeToken.update(
    { usedAt: now },
    { where: { id: token.id, usedAt: null, expiresAt: { [Op.gt]: now } }, transaction },
  )
  if (changed !== 1) return null
  if (token.userId !== null) {
    await OneTimeToken.update(
      { usedAt: now },
      { where: { userId: token.userId, purpose: purposes, usedAt: null, id: { [Op.ne]: token.id } }, transaction },
    )
  }
  return token
}
