import { dictionary } from '@zxcvbn-ts/language-common'
import { OneTimeToken, User } from '../../db/models'
import { newPasswordSchema } from '#shared/auth/schemas'

// The common-password list that ships with zxcvbn-ts (about 30,000 entries, lower case).
const COMMON = new Set<string>(dictionary['passwords-common'] as string[])

/** Letters and digits only, lower case: how passwords and names are compared. */
function letters(text: string): string {
  return text.normalize('NFKC').toLowerCase().replace(/[^\p{L}\p{N}]+/gu, '')
}

/**
 * On the list as typed, or once digits and symbols around it are taken off
 * ("Password123!" is "password"), or with its spaces taken out.
 */
export function isCommonPassword(password: string): boolean {
  const lowered = password.normalize('NFKC').toLowerCase().trim()
  const core = lowered.replace(/^[\d\W_]+|[\d\W_]+$/gu, '')
  return [lowered, core, core.replace(/\s+/g, ''), lowered.replace(/\d+$/, '')].some(c => c.length > 0 && COMMON.has(c))
}

/** What a password must not be made of besides the common list: who he is and where. */
export interface PasswordContext {
  email?: string | null
  name?: string | null
  clinicName?: string | null
}

/** Tidewell's own name is always on the list. */
const ALWAYS = ['Tidewell']

/** A remainder shorter than this, once the personal words are taken out, is not enough. */
const MIN_REMAINDER = 6

export function personalWords(context: PasswordContext): string[] {
  const words = new Set<string>()
  const add = (text: string | null | undefined) => {
    const w = letters(text ?? '')
    if (w.length >= 3) words.add(w)
  }
  const email = context.email?.trim().toLowerCase() ?? ''
  const local = email.split('@')[0] ?? ''
  add(email)
  add(local)
  local.split(/[._+-]+/).forEach(add)
  add(context.name)
  context.name?.split(/\s+/).forEach(add)
  add(context.clinicName)
  context.clinicName?.split(/\s+/).forEach(add)
  ALWAYS.forEach(add)
  // Longest first, so "eliasmarwood" goes before "elias".
  return [...words].sort((a, b) => b.length - a.length)
}

/**
 * True when the password is mostly his e-mail, name, the clinic's name or "Tidewell":
 * with every one of those taken out (letters and digits compared, case ignored), fewer
 * than six characters are left. A long sentence that happens to hold one of them passes.
 */
export function isPersonalPassword(password: string, context: PasswordContext): boolean {
  let rest = letters(password)
  let found = false
  for (const word of personalWords(context)) {
    if (rest.includes(word)) {
      found = true
      rest = rest.split(word).join('')
    }
  }
  return found && rest.length < MIN_REMAINDER
}

/** Locale keys of every rule the password breaks; empty when it is acceptable. */
export function passwordProblems(password: string, context: PasswordContext = {}): string[] {
  const result = newPasswordSchema.safeParse(password)
  const problems = result.success ? [] : result.error.issues.map(issue => issue.message)
  if (isCommonPassword(password)) problems.push('validation.password.common')
  if (isPersonalPassword(password, context)) problems.push('validation.password.personal')
  return problems
}

/** passwordProblems with the clinic's current name filled in. */
export async function passwordProblemsFor(password: string, context: Omit<PasswordContext, 'clinicName'>): Promise<string[]> {
  const { clinicName } = await getSettings()
  return passwordProblems(password, { ...context, clinicName })
}

/** passwordProblemsFor the account an invitation or reset link belongs to (read, not spent). */
export async function passwordProblemsForLink(raw: string, password: string): Promise<string[]> {
  await useDb()
  const token = await OneTimeToken.findOne({ where: { tokenHash: hashToken(raw), purpose: ['invite', 'reset'] } })
  const owner = token?.userId ? await User.findByPk(token.userId) : null
  return passwordProblemsFor(password, { email: owner?.email, name: owner?.name })
}
