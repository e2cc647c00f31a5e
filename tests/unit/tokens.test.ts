import { createHash } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { hashToken, isTokenUsable, newRawToken, TOKEN_TTL_MS } from '../../server/utils/auth/tokens'

describe('one-time tokens', () => {
  it('stores only the SHA-256 of the raw token', () => {
    const raw = newRawToken()
    expect(hashToken(raw)).toBe(createHash('sha256').update(raw).digest('hex'))
    expect(hashToken(raw)).not.toContain(raw)
  })

  it('makes 256-bit random tokens that never repeat', () => {
    const tokens = new Set(Array.from({ length: 1000 }, newRawToken))
    expect(tokens.size).toBe(1000)
    expect(Buffer.from([...tokens][0]!, 'base64url')).toHaveLength(32)
  })

  it('invitations last 72 hours and resets one hour', () => {
    expect(TOKEN_TTL_MS.invite).toBe(72 * 3600_000)
    expect(TOKEN_TTL_MS.reset).toBe(3600_000)
  })

  it('is usable until its expiry and never after it has been used', () => {
    const issued = new Date('2026-03-01T10:00:00Z')
    const token = { expiresAt: new Date(issued.getTime() + TOKEN_TTL_MS.reset), usedAt: null }
    expect(isTokenUsable(token, new Date('2026-03-01T10:59:59Z'))).toBe(true)
    expect(isTokenUsable(token, new Date('2026-03-01T11:00:00Z'))).toBe(false)
    expect(isTokenUsable({ ...token, usedAt: new Date('2026-03-01T10:05:00Z') }, new Date('2026-03-01T10:06:00Z'))).toBe(false)
  })
})
