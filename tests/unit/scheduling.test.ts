import { describe, expect, it } from 'vitest'
import { addDays } from '#shared/schedule/rules'
import { answerChangeRequestSchema, changeRequestSchema, preferredDatesOf, recordInjectionSchema, scheduleAppointmentSchema } from '#shared/schedule/schemas'
import { candidateDates, dueGroup, isWeekday, pickSlots, reminderLead } from '#shared/schedule/planning'

// Planning rules around the clinical schedule. The group edges, slot order and reminder
// choice are Tidewell's own design (no published source); the 7 and 1 lead days are the
// clinic's default setting (common practice, no source).

describe('due-list groups', () => {
  it('maps the clinical states and the days to the due date', () => {
    expect(dueGroup({ state: 'not-started', daysToDue: null })).toBe('not-started')
    expect(dueGroup({ state: 'overdue', daysToDue: -8 })).toBe('overdue')
    expect(dueGroup({ state: 'late', daysToDue: -1 })).toBe('late')
    expect(dueGroup({ state: 'due-today', daysToDue: 0 })).toBe('this-week')
    expect(dueGroup({ state: 'window-open', daysToDue: 6 })).toBe('this-week')
    expect(dueGroup({ state: 'upcoming', daysToDue: 7 })).toBe('next-two-weeks')
    expect(dueGroup({ state: 'upcoming', daysToDue: 20 })).toBe('next-two-weeks')
    expect(dueGroup({ state: 'upcoming', daysToDue: 21 })).toBeNull()
  })
})

describe('appointment slots', () => {
  // 2026-12-01 is a Tuesday.
  const today = '2026-12-01'

  it('knows the working days', () => {
    expect(['2026-12-04', '2026-12-05', '2026-12-06', '2026-12-07'].map(isWeekday)).toEqual([true, false, false, true])
  })

  it('offers weekdays inside the window, nearest the due date first, never before tomorrow', () => {
    const dueDate = '2026-12-09'
    const dates = candidateDates({ today, dueDate, windowOpens: addDays(dueDate, -7), windowCloses: addDays(dueDate, 7) })
    expect(dates[0]).toBe('2026-12-09')
    expect(dates.slice(1, 3)).toEqual(['2026-12-08', '2026-12-10'])
    for (const date of dates) {
      expect(isWeekday(date)).toBe(true)
      expect(date > today).toBe(true)
      expect(date <= '2026-12-16').toBe(true)
    }
    expect(dates).not.toContain('2026-12-01')
    expect(dates).toContain('2026-12-02')
  })

  it('falls back to the next working days when there is no window or it has closed', () => {
    expect(candidateDates({ today, dueDate: null, windowOpens: null, windowCloses: null }).slice(0, 4))
      .toEqual(['2026-12-02', '2026-12-03', '2026-12-04', '2026-12-07'])
    expect(candidateDates({ today, dueDate: '2026-11-10', windowOpens: '2026-11-03', windowCloses: '2026-11-17' })[0]).toBe('2026-12-02')
  })

  it('takes the first free clinic time of each date', () => {
    const taken = new Set(['2026-12-02 09:00', '2026-12-02 09:30', '2026-12-03 09:00'])
    expect(pickSlots(['2026-12-02', '2026-12-03', '2026-12-04'], ['09:00', '09:30', '10:00'], taken, 2))
      .toEqual([{ date: '2026-12-02', time: '10:00' }, { date: '2026-12-03', time: '09:30' }])
  })
})

describe('reminder lead days (clinic default 7 and 1)', () => {
  it('sends each reminder on its day and the one that applies after a missed day', () => {
    const leads = [7, 1]
    expect(reminderLead(8, leads)).toBeNull()
    expect(reminderLead(7, leads)).toBe(7)
    expect(reminderLead(5, leads)).toBe(7)
    expect(reminderLead(2, leads)).toBe(7)
    expect(reminderLead(1, leads)).toBe(1)
    expect(reminderLead(0, leads)).toBeNull()
    expect(reminderLead(-3, leads)).toBeNull()
    expect(reminderLead(3, [1, 7, 7, 0])).toBe(7)
  })
})

describe('form schemas', () => {
  const today = '2026-12-01'
  const injection = { date: today, time: '09:40', site: 'deltoid-left', lotNumber: 'LQ2437A', lotExpiresOn: '2027-10-31', regimenId: 2 }

  it('an injection dated in the future is refused at the date with a clear message key', () => {
    const result = recordInjectionSchema(today).safeParse({ ...injection, date: '2026-12-02' })
    expect(result.success).toBe(false)
    expect(result.error!.issues).toEqual([expect.objectContaining({ path: ['date'], message: 'validation.schedule.futureDate' })])
    expect(recordInjectionSchema(today).parse(injection)).toMatchObject({ date: today, regimenId: 2 })
  })

  it('an injection needs one of the six sites, a lot and a lot not expired on the day', () => {
    const messages = (input: object) => recordInjectionSchema(today).safeParse({ ...injection, ...input }).error?.issues.map(issue => `${issue.path.join('.')}:${issue.message}`)
    expect(messages({ site: 'forearm-left', lotNumber: ' ' })).toEqual(['site:validation.schedule.siteRequired', 'lotNumber:validation.schedule.lotRequired'])
    expect(messages({ lotExpiresOn: '2026-11-30' })).toEqual(['lotExpiresOn:validation.schedule.lotExpired'])
    expect(messages({ lotExpiresOn: today })).toBeUndefined()
    expect(messages({ date: '' })).toEqual(['date:validation.schedule.dateRequired'])
  })

  it('a request for another time needs a first date after today; the others are optional and different', () => {
    const schema = changeRequestSchema(today)
    expect(schema.parse({ firstChoice: '2026-12-03', secondChoice: '', thirdChoice: '', note: '' }))
      .toEqual({ firstChoice: '2026-12-03', secondChoice: undefined, thirdChoice: undefined, note: undefined })
    expect(preferredDatesOf(schema.parse({ firstChoice: '2026-12-03', thirdChoice: '2026-12-05' }))).toEqual(['2026-12-03', '2026-12-05'])
    const messages = (input: object) => schema.safeParse(input).error?.issues.map(issue => `${issue.path.join('.')}:${issue.message}`)
    expect(messages({ firstChoice: today })).toEqual(['firstChoice:validation.schedule.choiceNotFuture'])
    expect(messages({ firstChoice: '' })).toEqual(['firstChoice:validation.schedule.choiceRequired'])
    expect(messages({ firstChoice: '2026-12-03', secondChoice: '2026-12-03' })).toEqual(['secondChoice:validation.schedule.choiceRepeated'])
  })

  it('an appointment is booked for today or later; moving one needs a date and a time', () => {
    expect(scheduleAppointmentSchema(today).safeParse({ date: '2026-11-30', time: '09:00', place: 'Room 2' }).success).toBe(false)
    expect(scheduleAppointmentSchema(today).parse({ date: today, time: '16:00', place: 'Room 2' }).durationMinutes).toBe(30)
    const move = answerChangeRequestSchema(today).safeParse({ decision: 'move', date: '', time: '' })
    expect(move.error!.issues.map(issue => issue.path.join('.')).sort()).toEqual(['date', 'time'])
    expect(answerChangeRequestSchema(today).parse({ decision: 'keep', note: '' })).toEqual({ decision: 'keep', date: undefined, time: undefined, place: undefined, note: undefined })
  })
})
