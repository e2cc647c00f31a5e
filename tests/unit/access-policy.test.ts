import { describe, expect, it } from 'vitest'
import type { PatientAction, Relation } from '../../server/utils/access'
import { can, PATIENT_ACTIONS } from '../../server/utils/access'
import type { Role } from '../../shared/types/roles'

const viewOnly: Relation = { kind: 'caregiver', grant: { canLogDiary: false, canManageAppointments: false } }
const viewLog: Relation = { kind: 'caregiver', grant: { canLogDiary: true, canManageAppointments: false } }
const viewAppointments: Relation = { kind: 'caregiver', grant: { canLogDiary: false, canManageAppointments: true } }
const revoked: Relation = { kind: 'caregiver', grant: null }

type Row = [label: string, role: Role, relation: Relation, allowed: PatientAction[]]

// The whole policy as data: every action not listed for a row must be refused.
const TABLE: Row[] = [
  ['patient, own record', 'patient', { kind: 'self' }, ['patient.read', 'diary.write', 'appointment.respond', 'circle.read', 'circle.manage', 'access-history.read', 'contact.manage']],
  ['patient, another record', 'patient', { kind: 'none' }, []],
  ['caregiver, view only', 'caregiver', viewOnly, ['patient.read']],
  ['caregiver, view and log', 'caregiver', viewLog, ['patient.read', 'diary.write']],
  ['caregiver, view and appointments', 'caregiver', viewAppointments, ['patient.read', 'appointment.respond']],
  ['caregiver, revoked or never granted', 'caregiver', revoked, []],
  ['nurse', 'nurse', { kind: 'staff' }, ['patient.read', 'appointment.schedule', 'injection.record', 'patient.manage', 'circle.read', 'circle.manage', 'triage.work', 'risk-profile.manage', 'contact.manage']],
  ['clinician', 'clinician', { kind: 'staff' }, ['patient.read', 'appointment.schedule', 'injection.record', 'patient.manage', 'circle.read', 'triage.work', 'risk-profile.manage', 'contact.manage']],
  ['admin', 'admin', { kind: 'staff' }, ['patient.read', 'appointment.schedule', 'patient.manage', 'circle.read', 'circle.manage', 'contact.manage']],
  ['patient posing as staff', 'patient', { kind: 'staff' }, []],
  ['caregiver posing as self', 'caregiver', { kind: 'self' }, []],
]

describe('access policy', () => {
  for (const [label, role, relation, allowed] of TABLE) {
    for (const action of PATIENT_ACTIONS) {
      const expected = allowed.includes(action)
      it(`${label}: ${action} -> ${expected ? 'allowed' : 'refused'}`, () => {
        expect(can(role, relation, action)).toBe(expected)
      })
    }
  }

  it('only nurses and clinicians read or set the risk profile; no patient or caregiver sets his own', () => {
    for (const relation of [{ kind: 'self' }, viewLog, viewAppointments] as Relation[]) {
      expect(can(relation.kind === 'self' ? 'patient' : 'caregiver', relation, 'risk-profile.manage')).toBe(false)
    }
    expect(can('admin', { kind: 'staff' }, 'risk-profile.manage')).toBe(false)
    expect(can('caregiver', viewLog, 'contact.manage')).toBe(false)
  })

  it('staff never write a diary entry or answer for the patient', () => {
    for (const role of ['nurse', 'clinician', 'admin'] as const) {
      expect(can(role, { kind: 'staff' }, 'diary.write')).toBe(false)
      expect(can(role, { kind: 'staff' }, 'appointment.respond')).toBe(false)
    }
  })
})
