import type { Transaction } from 'sequelize'
import { addDays, localDate, suggestSite, zonedDateTimeToUtc } from '#shared/schedule/rules'
import type { SiteUse } from '#shared/schedule/rules'
import { candidateDates } from '#shared/schedule/planning'
import { DEFAULT_SETTINGS } from '../../utils/core/settings'
import { Appointment, AppointmentChangeRequest, ClinicSetting, Injection, Patient, PatientRegimen, Regimen, User } from '../models'

/**
 * The demo clinic's injection schedules, counted back from the day the demo is seeded so
 * the due list always shows every state: overdue, late, due today, due this week, in the
 * next two weeks, upcoming, one man in his flare watch and one not started. Lot numbers
 * are invented.
 */
interface DemoSchedule {
  clinicNumber: string
  regimen: string
  /** Days from the last injection to today; null for no injection yet. */
  lastDaysAgo: number | null
  injections: number
  /** onDay: that many days from today (the next working day from it); today: today, whatever the day. */
  appointment?: { time: string, status: 'booked' | 'confirmed' | 'change-requested', onDay?: number, today?: true }
}

const PLACE = 'Larkspur Point Urology, injection room 2, 410 Quarry Lane'

const DEMO_SCHEDULES: DemoSchedule[] = [
  // Due in 6 days (window open) with an appointment waiting for his confirmation.
  { clinicNumber: 'LPU-1001', regimen: '3-month depot', lastDaysAgo: 78, injections: 4, appointment: { time: '10:30', status: 'booked' } },
  // Due in 2 days; his caregiver may only view.
  { clinicNumber: 'LPU-1002', regimen: '1-month depot', lastDaysAgo: 26, injections: 6, appointment: { time: '09:30', status: 'booked' } },
  // Overdue by 11 days, no appointment.
  { clinicNumber: 'LPU-1003', regimen: '3-month depot', lastDaysAgo: 95, injections: 3 },
  // Late by 3 days, booked for today (the day's injection list).
  { clinicNumber: 'LPU-1004', regimen: '6-month depot', lastDaysAgo: 171, injections: 2, appointment: { time: '11:30', status: 'booked', today: true } },
  // First injection 10 days ago: in his flare watch; due in 18 days.
  { clinicNumber: 'LPU-1005', regimen: '1-month depot', lastDaysAgo: 10, injections: 1, appointment: { time: '11:00', status: 'booked' } },
  // Not started: regimen set, first injection booked.
  { clinicNumber: 'LPU-1006', regimen: '3-month depot', lastDaysAgo: null, injections: 0, appointment: { time: '09:00', status: 'confirmed', onDay: 5 } },
  // Due in 12 days, appointment confirmed.
  { clinicNumber: 'LPU-1007', regimen: '4-month depot', lastDaysAgo: 100, injections: 3, appointment: { time: '13:30', status: 'confirmed' } },
  // Upcoming, due in 44 days.
  { clinicNumber: 'LPU-1008', regimen: '3-month depot', lastDaysAgo: 40, injections: 5 },
  // Due today, confirmed for this morning (the day's injection list).
  { clinicNumber: 'LPU-1009', regimen: '1-month depot', lastDaysAgo: 28, injections: 8, appointment: { time: '08:30', status: 'confirmed', today: true } },
  // Upcoming, due in 108 days.
  { clinicNumber: 'LPU-1010', regimen: '6-month depot', lastDaysAgo: 60, injections: 2 },
  // Overdue by 16 days, booked for this afternoon (the day's injection list).
  { clinicNumber: 'LPU-1011', regimen: '3-month depot', lastDaysAgo: 100, injections: 4, appointment: { time: '15:00', status: 'booked', today: true } },
  // Late by 5 days; he asked for another time.
  { clinicNumber: 'LPU-1012', regimen: '1-month depot', lastDaysAgo: 33, injections: 5, appointment: { time: '14:00', status: 'change-requested' } },
]

const INJECTION_TIMES = ['09:15', '10:40', '13:20', '14:50']

function lotNumber(seed: number): string {
  const letters = 'ACEHKMRTWX'
  return `LQ${String(2400 + seed * 37).padStart(4, '0')}${letters[seed % letters.length]}`
}

export async function seedDemoSchedules(transaction: Transaction) {
  const stored = await ClinicSetting.findByPk('timeZone', { transaction })
  const timeZone = typeof stored?.value === 'string' ? stored.value : DEFAULT_SETTINGS.timeZone
  const now = new Date()
  const today = localDate(now, timeZone)
  const regimens = new Map((await Regimen.findAll({ transaction })).map(r => [r.name, r]))
  const staff = await User.findAll({ where: { role: ['nurse', 'clinician'] }, order: [['id', 'ASC']], transaction })
  const nurse = staff.find(u => u.role === 'nurse')!

  let seed = 0
  for (const plan of DEMO_SCHEDULES) {
    const patient = await Patient.findOne({ where: { clinicNumber: plan.clinicNumber }, transaction })
    const regimen = regimens.get(plan.regimen)
    if (!patient || !regimen) continue

    const history: SiteUse[] = []
    const dates = plan.lastDaysAgo === null
      ? []
      : Array.from({ length: plan.injections }, (_, i) => addDays(today, -plan.lastDaysAgo! - (plan.injections - 1 - i) * regimen.intervalDays))
    for (const date of dates) {
      seed++
      const site = suggestSite(history)
      history.push({ site, date })
      await Injection.create({
        patientId: patient.id,
        regimenId: regimen.id,
        givenAt: zonedDateTimeToUtc(date, INJECTION_TIMES[seed % INJECTION_TIMES.length]!, timeZone),
        givenOn: date,
        site,
        lotNumber: lotNumber(seed),
        lotExpiresOn: addDays(date, 300 + (seed % 5) * 30),
        givenByUserId: staff[seed % staff.length]!.id,
        note: null,
      }, { transaction })
    }
    await PatientRegimen.create({
      patientId: patient.id,
      regimenId: regimen.id,
      startsOn: dates[0] ?? addDays(today, plan.appointment?.onDay ?? 7),
      endsOn: null,
      setByUserId: nurse.id,
    }, { transaction })

    if (!plan.appointment) continue
    const last = dates.at(-1) ?? null
    const dueDate = last ? addDays(last, regimen.intervalDays) : null
    const nextWorkingDay = (from: string) => candidateDates({ today: from, dueDate: null, windowOpens: null, windowCloses: null })[0]!
    const inWindow = dueDate
      ? candidateDates({
          today,
          dueDate,
          windowOpens: addDays(dueDate, -DEFAULT_SETTINGS.windowEarlyDays),
          windowCloses: addDays(dueDate, DEFAULT_SETTINGS.windowLateDays),
        })[0]
      : undefined
    const day = plan.appointment.today
      ? today
      : plan.appointment.onDay !== undefined
      ? nextWorkingDay(addDays(today, plan.appointment.onDay - 1))
      : inWindow ?? nextWorkingDay(today)
    const confirmed = plan.appointment.status === 'confirmed'
    const appointment = await Appointment.create({
      patientId: patient.id,
      startsAt: zonedDateTimeToUtc(day, plan.appointment.time, timeZone),
      durationMinutes: 30,
      place: PLACE,
      status: plan.appointment.status,
      confirmedAt: confirmed ? now : null,
      confirmedByUserId: confirmed ? patient.userId : null,
      createdByUserId: nurse.id,
    }, { transaction })
    if (plan.appointment.status === 'change-requested') {
      await AppointmentChangeRequest.create({
        appointmentId: appointment.id,
        patientId: patient.id,
        requestedByUserId: patient.userId,
        preferredDates: [nextWorkingDay(addDays(day, 1)), nextWorkingDay(nextWorkingDay(addDays(day, 1)))],
        note: 'Mi hija me lleva; ella solo puede por la tarde.',
        decision: null,
        answerNote: null,
        answeredByUserId: null,
        answeredAt: null,
      }, { transaction })
    }
  }
}
