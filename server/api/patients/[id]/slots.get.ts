import { Op } from 'sequelize'
import { addDays, localDate, zonedDateTimeToUtc } from '#shared/schedule/rules'
import { candidateDates, pickSlots } from '#shared/schedule/planning'
import { OPEN_APPOINTMENT_STATUSES } from '#shared/schedule/statuses'
import { Appointment } from '../../../db/models'

/** Clinic injection times, every half hour from 09:00 to 15:30 (the demo clinic's hours). */
const CLINIC_TIMES = Array.from({ length: 14 }, (_, i) => `${String(9 + Math.floor(i / 2)).padStart(2, '0')}:${i % 2 ? '30' : '00'}`)
const SLOT_COUNT = 6

/** Free appointment slots inside the patient's window, nearest the due date first (staff). */
export default defineEventHandler(async (event) => {
  const access = await authorizePatient(event, idParam(event), 'appointment.schedule')
  const clock = await scheduleClock()
  const schedule = await computeSchedule(access.patient.id, clock)
  const dates = candidateDates({ today: clock.today, ...schedule })
  if (!dates.length) return { slots: [] }
  const tz = clock.settings.timeZone
  const sorted = [...dates].sort()
  const booked = await Appointment.findAll({
    where: {
      status: { [Op.in]: [...OPEN_APPOINTMENT_STATUSES] },
      startsAt: { [Op.gte]: startOfClinicDay(sorted[0]!, tz), [Op.lt]: startOfClinicDay(addDays(sorted.at(-1)!, 1), tz) },
    },
    attributes: ['startsAt'],
  })
  const taken = new Set(booked.map(a => `${localDate(a.startsAt, tz)} ${clinicClockTime(a.startsAt, tz)}`))
  return {
    slots: pickSlots(dates, CLINIC_TIMES, taken, SLOT_COUNT).map(slot => ({
      ...slot,
      startsAt: zonedDateTimeToUtc(slot.date, slot.time, tz).toISOString(),
    })),
  }
})
