import { Op } from 'sequelize'
import { describe, expect, it } from 'vitest'
import { auditKind, auditWhere, spreadsheetSafe } from '../../server/utils/audit/audit-trail'
import { auditQuerySchema } from '#shared/audit/schemas'

describe('audit filters', () => {
  it('turns a date range into whole days in the clinic\'s time zone, end day included', () => {
    const query = auditQuerySchema.parse({ from: '2026-03-07', to: '2026-03-08', actor: '4', patient: '', action: 'patient.read', outcome: 'refused-policy' })
    const where = auditWhere(query, 'America/Chicago') as Record<string | symbol, unknown>
    expect(where).toMatchObject({ actorUserId: 4, action: 'patient.read', outcome: 'refused-policy' })
    expect(where).not.toHaveProperty('patientId')
    const at = where.at as Record<symbol, Date>
    // Chicago is UTC-6 until daylight saving starts at 02:00 on 8 March 2026, then UTC-5.
    expect(at[Op.gte]!.toISOString()).toBe('2026-03-07T06:00:00.000Z')
    expect(at[Op.lt]!.toISOString()).toBe('2026-03-09T05:00:00.000Z')
  })

  it('leaves out what was not asked for, and refuses an end before the start or unknown fields', () => {
    expect(auditWhere(auditQuerySchema.parse({}), 'UTC')).toEqual({})
    expect(auditQuerySchema.safeParse({ from: '2026-03-08', to: '2026-03-07' }).success).toBe(false)
    expect(auditQuerySchema.safeParse({ actor: 'someone' }).success).toBe(false)
    expect(auditQuerySchema.safeParse({ action: 'patient.read; drop' }).success).toBe(false)
    expect(auditQuerySchema.safeParse({ sort: 'id' }).success).toBe(false)
  })
})

describe('audit lines', () => {
  it('a GET is a look and any other method a change; without a method, *.read actions are looks', () => {
    expect(auditKind('appointment.schedule', 'GET /api/patients/1/slots')).toBe('viewed')
    expect(auditKind('appointment.schedule', 'POST /api/patients/1/appointments')).toBe('changed')
    expect(auditKind('circle.manage', 'DELETE /api/patients/1/circle/2')).toBe('changed')
    expect(['patient.read', 'circle.read', 'access-history.read'].map(a => auditKind(a, 'care-grant:3'))).toEqual(['viewed', 'viewed', 'viewed'])
    expect(['diary.write', 'circle.remove', 'appointment.respond'].map(a => auditKind(a))).toEqual(['changed', 'changed', 'changed'])
  })

  it('a CSV cell a spreadsheet would run as a formula starts with an apostrophe (OWASP, CSV injection)', () => {
    expect(['=1+1', '+SUM(A1)', '-2+3', '@cmd', '\tx', 'Marisol Marwood', 'GET /api/patients/1', 7, null].map(spreadsheetSafe))
      .toEqual(['\'=1+1', '\'+SUM(A1)', '\'-2+3', '\'@cmd', '\'\tx', 'Marisol Marwood', 'GET /api/patients/1', 7, null])
  })
})
