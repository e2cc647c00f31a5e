import { describe, expect, it } from 'vitest'
import type { ZodTypeAny } from 'zod'
import { auditQuerySchema, pageQuerySchema } from '#shared/audit/schemas'
import { circleInviteSchema } from '#shared/circle/schemas'
import { createUserSchema, newPasswordSchema } from '#shared/auth/schemas'
import { patientContactSchema } from '#shared/contact/schemas'
import { diaryEntrySchema, emptyDiaryEntry } from '#shared/diary/schemas'
import { labResultSchema } from '#shared/labs/schemas'
import { createRegimenSchema, recordInjectionSchema, scheduleAppointmentSchema, setRegimenSchema } from '#shared/schedule/schemas'
import { clinicSettingsSchema } from '#shared/settings/schemas'
import { hasUnsafeCharacters, idString, intQuery, safeText } from '#shared/common/text'
import { triageActionSchema, triageQuerySchema } from '#shared/triage/schemas'
import { visitKitSchema } from '#shared/visit/schemas'

const UNSAFE = {
  'NUL': 'Elias\u0000 Marwood',
  'an ANSI escape': '\u001b[31mElias Marwood',
  'a right-to-left override': 'Elias \u202Edoowram',
  'a left-to-right isolate': 'Elias \u2066Marwood',
  'a C1 control (NEL)': 'Elias\u0085Marwood',
  'DEL': 'Elias\u007FMarwood',
}
const ORDINARY = ['José Ñúñez-Peña', 'Maëlle O\'Connor', 'Ángel Ibáñez 🙂', 'D\'Arcy Smythe-Wong', 'Łukasz Grünewald']

/** The messages a schema gives at one field path, or [] when it accepts the input. */
function messagesAt(schema: ZodTypeAny, input: unknown, path: string): string[] {
  const result = schema.safeParse(input)
  return result.success ? [] : result.error.issues.filter(issue => issue.path.join('.') === path).map(issue => issue.message)
}

const today = '2026-12-02'
const invite = { name: 'Rosa Marwood', email: 'rosa@example.test', canLogDiary: true, canManageAppointments: false }

describe('safeText: what a text field refuses', () => {
  it.each(Object.entries(UNSAFE))('a one-line field refuses %s', (_, value) => {
    expect(hasUnsafeCharacters(value)).toBe(true)
    expect(messagesAt(safeText(), value, '')).toEqual(['validation.text.unsafe'])
  })

  it('a one-line field refuses a newline, a carriage return and a tab, even at the end (checked before trim)', () => {
    for (const value of ['Elias\nMarwood', 'Elias\rMarwood', 'Elias\tMarwood', 'Elias Marwood\n']) {
      expect(messagesAt(safeText().trim(), value, ''), JSON.stringify(value)).toEqual(['validation.text.unsafe'])
    }
  })

  it('a multi-line note keeps newline, carriage return and tab, and still refuses the rest', () => {
    expect(safeText({ multiLine: true }).parse('Line one\r\nLine two\n\tindented')).toBe('Line one\r\nLine two\n\tindented')
    for (const value of Object.values(UNSAFE)) {
      expect(messagesAt(safeText({ multiLine: true }), value, ''), JSON.stringify(value)).toEqual(['validation.text.unsafe'])
    }
  })

  it.each(ORDINARY)('accepts ordinary text: %s', (value) => {
    expect(safeText().parse(value)).toBe(value)
    expect(safeText({ multiLine: true }).parse(value)).toBe(value)
  })
})

describe('every free-text field of the schemas uses it', () => {
  const fields: [string, ZodTypeAny, (text: string) => unknown, string][] = [
    ['account name', createUserSchema, name => ({ email: 'a@example.test', name, role: 'nurse' }), 'name'],
    ['clinic number', createUserSchema, clinicNumber => ({ email: 'a@example.test', name: 'A B', role: 'patient', patient: { clinicNumber, dateOfBirth: '1950-01-01' } }), 'patient.clinicNumber'],
    ['caregiver invitation name', circleInviteSchema, name => ({ ...invite, name }), 'name'],
    ['regimen name', createRegimenSchema, name => ({ name, intervalDays: 28 }), 'name'],
    ['clinic name', clinicSettingsSchema, clinicName => ({ clinicName }), 'clinicName'],
    ['best times to call', patientContactSchema, bestTimes => ({ phones: [], bestTimes, preferred: 'phone' }), 'bestTimes'],
    ['phone number', patientContactSchema, number => ({ phones: [{ label: 'home', number }], bestTimes: '', preferred: 'phone' }), 'phones.0.number'],
    ['appointment place', scheduleAppointmentSchema(today), place => ({ date: today, time: '10:00', place }), 'place'],
    ['lot number', recordInjectionSchema(today), lotNumber => ({ date: today, time: '09:00', site: 'deltoid-left', lotNumber, lotExpiresOn: '2027-01-01', regimenId: 1 }), 'lotNumber'],
    ['diary note', diaryEntrySchema, note => ({ ...emptyDiaryEntry(), note }), 'note'],
    ['lab note', labResultSchema(today), note => ({ kind: 'psa', takenOn: today, value: 0.4, note }), 'note'],
    ['triage note', triageActionSchema, note => ({ type: 'note', note }), 'note'],
    ['queue search', triageQuerySchema, q => ({ q }), 'q'],
    ['carton scan', visitKitSchema, barcode => ({ barcode, regimenId: 1, powderOk: true, diluentOk: true }), 'barcode'],
  ]

  it.each(fields)('%s refuses NUL and a right-to-left override', (_, schema, input, path) => {
    expect(messagesAt(schema, input('Marwood\u0000 555-0114'), path)).toContain('validation.text.unsafe')
    expect(messagesAt(schema, input('Marwood \u202E555-0114'), path)).toContain('validation.text.unsafe')
  })

  it('multi-line notes keep their new lines; names accept accents, apostrophes and emoji', () => {
    expect(diaryEntrySchema.parse({ ...emptyDiaryEntry(), note: 'Tired.\nSlept badly.' }).note).toBe('Tired.\nSlept badly.')
    expect(triageActionSchema.parse({ type: 'note', note: 'Called.\n\tNo answer.' })).toEqual({ type: 'note', note: 'Called.\n\tNo answer.' })
    for (const name of ORDINARY) {
      expect(circleInviteSchema.parse({ ...invite, name }).name).toBe(name)
      expect(createRegimenSchema.parse({ name, intervalDays: 28 }).name).toBe(name)
    }
    expect(messagesAt(circleInviteSchema, { ...invite, name: 'Rosa\nMarwood' }, 'name')).toEqual(['validation.text.unsafe'])
  })

  it('a carton scan keeps the GS character that ends its lot (GS1 FNC1, ASCII 29), and no other control character', () => {
    const kit = (barcode: string) => ({ barcode, regimenId: 1, powderOk: true, diluentOk: true })
    const scan = `]d2010950600013435210LOT-7\u001D17271225`
    expect(visitKitSchema.parse(kit(scan)).barcode).toBe(scan)
    for (const value of [`${scan}\u001b[31m`, `${scan}\n`, `\t${scan}`]) {
      expect(messagesAt(visitKitSchema, kit(value), 'barcode'), JSON.stringify(value)).toEqual(['validation.text.unsafe'])
    }
  })

  it('a new password may hold spaces and symbols but no control character', () => {
    expect(newPasswordSchema.safeParse('quiet harbour ¿lluvia? 42').success).toBe(true)
    expect(messagesAt(newPasswordSchema, 'quiet harbour\u0000 lluvia 42', '')).toEqual(['validation.text.unsafe'])
  })
})

describe('numbers and ids are never coerced', () => {
  it.each([true, 'true', '1e3', ' 1', '0x1', '-1', '1.0', '+1', '', 'Infinity'])('idString refuses %j', (value) => {
    expect(idString().safeParse(value).success).toBe(false)
  })

  it('idString and intQuery take plain digits, with a fallback when missing or empty', () => {
    expect(idString().parse('42')).toBe(42)
    expect(idString({ optional: true }).parse('')).toBeUndefined()
    expect(intQuery({ min: 1, max: 100, fallback: 50 }).parse(undefined)).toBe(50)
    expect(intQuery({ min: 1, max: 100, fallback: 50 }).parse('')).toBe(50)
    expect(intQuery({ min: 1, max: 100 }).safeParse('101').success).toBe(false)
    expect(idString().safeParse('0').success).toBe(false)
    expect(idString().safeParse(['1', '2']).success).toBe(false)
  })

  it('query schemas (queue, audit, access history pages) refuse true, 1e3 and " 1"', () => {
    for (const bad of ['true', '1e3', ' 1', '0x1']) {
      expect(messagesAt(triageQuerySchema, { page: bad }, 'page'), bad).not.toEqual([])
      expect(messagesAt(triageQuerySchema, { pageSize: bad }, 'pageSize'), bad).not.toEqual([])
      expect(messagesAt(pageQuerySchema, { page: bad }, 'page'), bad).not.toEqual([])
      expect(messagesAt(auditQuerySchema, { patient: bad }, 'patient'), bad).not.toEqual([])
    }
    expect(triageQuerySchema.parse({ page: '2', pageSize: '10' })).toMatchObject({ page: 2, pageSize: 10 })
    expect(auditQuerySchema.parse({ actor: '', patient: '7', page: '' })).toMatchObject({ actor: undefined, patient: 7, page: 1 })
  })

  it('a regimen id in a body is a number, never true or text', () => {
    for (const bad of [true, '1', '1e3', 1.5, 0, -1]) {
      expect(messagesAt(setRegimenSchema, { regimenId: bad, startsOn: today }, 'regimenId'), String(bad)).toEqual(['validation.schedule.regimenRequired'])
    }
    expect(setRegimenSchema.parse({ regimenId: 2, startsOn: today }).regimenId).toBe(2)
    expect(messagesAt(createRegimenSchema, { name: 'Every 4 weeks', intervalDays: true }, 'intervalDays')).toEqual(['validation.schedule.intervalRange'])
    expect(messagesAt(createRegimenSchema, { name: 'Every 4 weeks', intervalDays: '28' }, 'intervalDays')).toEqual(['validation.schedule.intervalRange'])
    expect(messagesAt(scheduleAppointmentSchema(today), { date: today, time: '10:00', place: 'Room 2', durationMinutes: true }, 'durationMinutes')).toEqual(['validation.schedule.durationRange'])
    expect(messagesAt(triageActionSchema, { type: 'claim', from: true }, 'from')).not.toEqual([])
  })

  it('a lab value is a number or a typed decimal; true, 1e3, 0x1 and Infinity are refused', () => {
    const lab = labResultSchema(today)
    for (const bad of [true, '1e3', '0x1', 'Infinity', ' 1 2', '1.2.3']) {
      expect(messagesAt(lab, { kind: 'psa', takenOn: today, value: bad }, 'value'), String(bad)).toEqual(['validation.labs.valueRequired'])
    }
    expect(messagesAt(lab, { kind: 'qtc', takenOn: today, value: 430, heartRate: true }, 'heartRate')).toEqual(['validation.labs.valueRequired'])
    expect(lab.parse({ kind: 'psa', takenOn: today, value: '0,4' })).toMatchObject({ value: 0.4 })
    expect(lab.parse({ kind: 'psa', takenOn: today, value: ' 12.5 ' })).toMatchObject({ value: 12.5 })
    expect(lab.parse({ kind: 'psa', takenOn: today, value: 3 })).toMatchObject({ value: 3 })
  })
})
