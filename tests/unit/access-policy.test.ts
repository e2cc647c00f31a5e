import { describe, expect, it } from 'vitest'
import type { PatientAction, Relation } from '../../server/utils/auth/access'
import { can, PATIENT_ACTIONS } from '../../server/utils/auth/access'
import type { Role } from '#shared/auth/roles'

/*
 * The access policy written out cell by cell, from who may do what in
 * ../shared/PRODUCT.md (the four journeys and "Staff also ...") and the route table in
 * README.md (API, "who" column) where PRODUCT.md does not split the staff roles. Nothing
 * here is built from server/utils/auth/access.ts: the actions are listed literally and a new
 * action in the code fails the first test until its column is added here.
 */
const ACTIONS = [
  'patient.read',
  'diary.write',
  'appointment.respond',
  'appointment.schedule',
  'injection.record',
  'regimen.set',
  'labs.record',
  'circle.read',
  'circle.manage',
  'access-history.read',
  'triage.work',
  'risk-profile.manage',
  'contact.manage',
  'monitoring.read',
  'monitoring.manage',
  'message.read',
  'message.write',
  'message.manage',
] as const satisfies readonly PatientAction[]

const viewOnly: Relation = { kind: 'caregiver', grant: { canLogDiary: false, canManageAppointments: false, canMessage: false } }
const viewLog: Relation = { kind: 'caregiver', grant: { canLogDiary: true, canManageAppointments: false, canMessage: false } }
const viewAppointments: Relation = { kind: 'caregiver', grant: { canLogDiary: false, canManageAppointments: true, canMessage: false } }
const viewMessages: Relation = { kind: 'caregiver', grant: { canLogDiary: false, canManageAppointments: false, canMessage: true } }
const viewAll: Relation = { kind: 'caregiver', grant: { canLogDiary: true, canManageAppointments: true, canMessage: true } }
const revoked: Relation = { kind: 'caregiver', grant: null }

type Row = [label: string, role: Role, relation: Relation, cells: string]

/*
 * One column per action, in the order of ACTIONS; Y allowed, . refused:
 *   read  diary  respond  schedule  inject  regimen  labs  c.read  c.manage  history  triage  risk  contact  mon.read  mon.manage
 *   m.read  m.write  m.manage
 */
const MATRIX: Row[] = [
  // Journeys 1 and 2 (confirms, logs); 4 (invites his caregivers); README: his access history and contact.
  ['patient, own record', 'patient', { kind: 'self' }, 'Y Y Y . . . . Y Y Y . . Y . . Y Y .'],
  ['patient, another record', 'patient', { kind: 'none' }, '. . . . . . . . . . . . . . . . . .'],
  // Journey 4: "view only, or also log symptoms and confirm appointments".
  ['caregiver, view only', 'caregiver', viewOnly, 'Y . . . . . . . . . . . . . . . . .'],
  ['caregiver, view and log', 'caregiver', viewLog, 'Y Y . . . . . . . . . . . . . . . .'],
  ['caregiver, view and appointments', 'caregiver', viewAppointments, 'Y . Y . . . . . . . . . . . . . . .'],
  // Issue 13: messages are a permission of their own; reading them comes with it.
  ['caregiver, view and messages', 'caregiver', viewMessages, 'Y . . . . . . . . . . . . . . Y Y .'],
  ['caregiver, every grant', 'caregiver', viewAll, 'Y Y Y . . . . . . . . . . . . Y Y .'],
  ['caregiver, revoked or never granted', 'caregiver', revoked, '. . . . . . . . . . . . . . . . . .'],
  // Journey 3 (triage) and "Staff also": roster, injections, appointments, labs; README: regimen and
  // labs (nurse, clinician), circle on his behalf (nurse, admin), risk profile (nurse, clinician),
  // contact (staff). Issue 12: the monitoring plan is the clinician's (he owns and changes it);
  // nurses read it; the patient and his caregivers read what is due through patient.read.
  ['nurse', 'nurse', { kind: 'staff' }, 'Y . . Y Y Y Y Y Y . Y Y Y Y . Y Y Y'],
  ['clinician', 'clinician', { kind: 'staff' }, 'Y . . Y Y Y Y Y . . Y Y Y Y Y Y Y Y'],
  // README: injections, labs, regimen, triage and risk profile are nurse and clinician only.
  // Issue 13: staff who answer messages (nurses and clinicians) read, write and manage them; admins none.
  ['admin', 'admin', { kind: 'staff' }, 'Y . . Y . . . Y Y . . . Y . . . . .'],
  ['patient posing as staff', 'patient', { kind: 'staff' }, '. . . . . . . . . . . . . . . . . .'],
  ['caregiver posing as self', 'caregiver', { kind: 'self' }, '. . . . . . . . . . . . . . . . . .'],
  ['nurse with no relation', 'nurse', { kind: 'none' }, '. . . . . . . . . . . . . . . . . .'],
]

describe('access policy', () => {
  it('has exactly the actions this matrix has columns for', () => {
    expect([...PATIENT_ACTIONS]).toEqual([...ACTIONS])
  })

  it('every row of the matrix has one cell per action', () => {
    for (const [label, , , cells] of MATRIX) expect(cells.split(' '), label).toHaveLength(ACTIONS.length)
  })

  for (const [label, role, relation, cells] of MATRIX) {
    const marks = cells.split(' ')
    ACTIONS.forEach((action, column) => {
      const allowed = marks[column] === 'Y'
      it(`${label}: ${action} -> ${allowed ? 'allowed' : 'refused'}`, () => {
        expect(can(role, relation, action)).toBe(allowed)
      })
    })
  }
})
