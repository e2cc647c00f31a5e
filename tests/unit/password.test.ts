import { describe, expect, it } from 'vitest'
import { isCommonPassword, passwordProblems } from '../../server/utils/password'

describe('password rules', () => {
  it('refuses fewer than 10 characters and accepts exactly 10', () => {
    expect(passwordProblems('kq7#vmzp2')).toContain('validation.password.tooShort')
    expect(passwordProblems('kq7#vmzp2x')).toEqual([])
  })

  it('refuses more than 128 characters and accepts exactly 128', () => {
    const long = 'tide-pool-'.repeat(13)
    expect(passwordProblems(long.slice(0, 128))).toEqual([])
    expect(passwordProblems(`${long.slice(0, 128)}x`)).toContain('validation.password.tooLong')
  })

  it('refuses passwords from the common-password list, in any case and with digits added', () => {
    expect(isCommonPassword('password123')).toBe(true)
    expect(isCommonPassword('Qwertyuiop')).toBe(true)
    expect(isCommonPassword('baseball2024')).toBe(true)
    expect(passwordProblems('1234567890')).toContain('validation.password.common')
  })

  it('accepts a long sentence nobody else uses', () => {
    expect(isCommonPassword('gulls over the breakwater at noon')).toBe(false)
    expect(passwordProblems('gulls over the breakwater at noon')).toEqual([])
  })
})
