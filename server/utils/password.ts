import { dictionary } from '@zxcvbn-ts/language-common'
import { newPasswordSchema } from '../../shared/schemas/auth'

// The common-password list that ships with zxcvbn-ts (about 30,000 entries, lower case).
const COMMON = new Set<string>(dictionary['passwords-common'] as string[])

export function isCommonPassword(password: string): boolean {
  const lowered = password.toLowerCase()
  return COMMON.has(lowered) || COMMON.has(lowered.replace(/\d+$/, ''))
}

/** Locale keys of every rule the password breaks; empty when it is acceptable. */
export function passwordProblems(password: string): string[] {
  const result = newPasswordSchema.safeParse(password)
  const problems = result.success ? [] : result.error.issues.map(issue => issue.message)
  if (isCommonPassword(password)) problems.push('validation.password.common')
  return problems
}
