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
}

export {}
