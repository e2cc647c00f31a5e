import { describe, expect, it } from 'vitest'
import { isRepetitive, isSequence } from '#shared/auth/schemas'
import { isCommonPassword, isPersonalPassword, passwordProblems } from '../../server/utils/auth/password'

const ELIAS = { email: 'elias.marwood@demo.tidewell.test', name: 'Elias Marwood', clinicName: 'Larkspur Point Urology' }

describe('password rules (NIST SP 800-63B)', () => {
  it('refuses fewer than 12 characters and accepts exactly 12', () => {
    expect(passwordProblems('kq7#vmzp2xw')).toContain('validation.password.tooShort')
    expect(passwordProblems('kq7#vmzp2xwr')).toEqual([])
  })

  it('refuses more than 128 characters and accepts exactly 128', () => {
    const long = 'gull-pool-'.repeat(13)
    expect(passwordProblems(long.slice(0, 128))).toEqual([])
    expect(passwordProblems(`${long.slice(0, 128)}x`)).toContain('validation.password.tooLong')
  })

  it('refuses every password the security review got accepted', () => {
    // Issue 11: ten spaces, aaaaaaaaaa, abcdefghij, Password1!, the user's own e-mail.
    expect(passwordProblems(' '.repeat(10), ELIAS)).toEqual(expect.arrayContaining(['validation.password.tooShort', 'validation.password.repetitive']))
    expect(passwordProblems('aaaaaaaaaa', ELIAS)).toContain('validation.password.repetitive')
    expect(passwordProblems('abcdefghij', ELIAS)).toContain('validation.password.sequence')
    expect(passwordProblems('Password1!', ELIAS)).toContain('validation.password.common')
    expect(passwordProblems('elias.marwood@demo.tidewell.test', ELIAS)).toContain('validation.password.personal')
  })

  it('refuses the same kinds at 12 characters and more, where length alone would let them in', () => {
    expect(passwordProblems(' '.repeat(12))).toEqual(['validation.password.repetitive'])
    expect(passwordProblems('AAAAAAAAAAAAAAAA')).toEqual(['validation.password.repetitive'])
    expect(passwordProblems('abababababab')).toEqual(['validation.password.repetitive'])
    expect(passwordProblems('xyzxyzxyzxyz')).toEqual(['validation.password.repetitive'])
    expect(passwordProblems('abcdefghijkl')).toContain('validation.password.sequence')
    expect(passwordProblems('ZYXWVUTSRQPO')).toContain('validation.password.sequence')
    expect(passwordProblems('123456789012')).toContain('validation.password.sequence')
    expect(passwordProblems('Password123!')).toEqual(['validation.password.common'])
    expect(passwordProblems('!!password2024')).toEqual(['validation.password.common'])
  })

  it('refuses the user\'s e-mail, its local part, his name, the clinic\'s name and Tidewell, with a few characters added', () => {
    for (const password of [
      'ELIAS.MARWOOD@demo.tidewell.test',
      'elias.marwood2024',
      'Elias Marwood 1950!',
      'marwoodmarwood',
      'Larkspur Point Urology',
      'larkspurpoint1',
      'Tidewell2024!',
      'tidewell-demo',
      'my tidewell!!',
    ]) expect(passwordProblems(password, ELIAS), password).toContain('validation.password.personal')
  })

  it('accepts a long sentence that only mentions one of those words', () => {
    expect(isPersonalPassword('waiting for the tidewell bus at noon', ELIAS)).toBe(false)
    expect(passwordProblems('gulls over the breakwater at noon', ELIAS)).toEqual([])
  })

  it('has no composition rules: lower-case words with spaces pass, symbols are not required', () => {
    expect(passwordProblems('lanterns along the quay', ELIAS)).toEqual([])
    expect(passwordProblems('kettle on by the window', ELIAS)).toEqual([])
  })

  it('knows the common-password list in any case and with digits or symbols around it', () => {
    expect(isCommonPassword('password123')).toBe(true)
    expect(isCommonPassword('Qwertyuiop')).toBe(true)
    expect(isCommonPassword('baseball2024')).toBe(true)
    expect(isCommonPassword('gulls over the breakwater at noon')).toBe(false)
  })

  it('tells repeats and sequences from ordinary text', () => {
    expect(isRepetitive('aaaa')).toBe(true)
    expect(isRepetitive('abcdabcdabcd')).toBe(false)
    expect(isSequence('9876543210')).toBe(true)
    expect(isSequence('abcdefgh1')).toBe(false)
    expect(isSequence('acegikmoqsuw')).toBe(false)
  })
})
