import type { Language, Role } from './roles'

declare module '#auth-utils' {
  interface User {
    id: number
    role: Role
    name: string
    language: Language
    /** Set for a patient: the record that is his own. */
    patientId: number | null
  }
  interface SecureSessionData {
    /** Half signed in: the password was right, the second factor is still to come (server/utils/auth/totp.ts). */
    secondFactor?: { userId: number, at: number }
    /** The user_sessions row this cookie stands for (server/utils/auth/sessions.ts). */
    sessionId?: string
    /** When he was last seen (ms), for the idle timeout; refreshed at most once a minute. */
    seenAt?: number
  }
}

export {}
