import { Op } from 'sequelize'
import { daysBetween, localDate } from '#shared/schedule/rules'
import { PLEASE_BOOK_DAYS, reminderLead } from '#shared/schedule/planning'
import { OPEN_APPOINTMENT_STATUSES } from '#shared/schedule/statuses'
import { Appointment, Patient, User } from '../../db/models'

/**
 * Daily: writes appointment reminders to the outbox at the clinic's lead days (default 7
 * and 1) with the calendar file attached, and one "please book" e-mail to a patient with
 * no appointment whose due date is PLEASE_BOOK_DAYS away or less. Every e-mail carries a
 * dedupe key, so running the task twice on a day (or on two servers) sends nothing twice.
 * It also reminds patients of the checks of their monitoring plan (queueMonitoringReminders).
 */
export default defineTask({
  meta: { name: 'schedule:reminders', description: 'Queue appointment reminders and "please book" e-mails' },
  run: ({ payload }) => runTaskOnce('schedule:reminders', payload, async (now) => {
    const clock = await scheduleClock(now)
    const tz = clock.settings.timeZone
    const sequelize = await useDb()
    let reminders = 0
    let pleaseBook = 0

    const appointments = await Appointment.findAll({
      where: { status: { [Op.in]: [...OPEN_APPOINTMENT_STATUSES] }, startsAt: { [Op.gt]: clock.now } },
      include: [{ model: Patient, as: 'patient', include: [{ model: User, as: 'user', where: { active: true } }] }],
      order: [['startsAt', 'ASC']],
    })
    for (const appointment of appointments) {
      const user = appointment.patient?.user
      if (!user) continue
      const daysUntil = daysBetween(clock.today, localDate(appointment.startsAt, tz))
      const lead = reminderLead(daysUntil, clock.settings.reminderLeadDays)
      if (lead === null) continue
      const queued = await sequelize.transaction(transaction => enqueueMail({
        ...mailTo(user),
        template: 'appointmentReminder',
        params: { name: user.name, when: formatAppointmentTime(appointment.startsAt, user.language, tz), place: appointment.place, days: daysUntil },
        linkPath: '/today',
        attachments: [calendarAttachment(appointment, { language: user.language, settings: clock.settings })],
        // The start is in the key: a moved appointment is reminded of again.
        dedupeKey: `appointment-reminder:${appointment.id}:${appointment.startsAt.toISOString()}:${lead}`,
      }, transaction))
      if (queued) reminders++
    }

    const withAppointment = new Set(appointments.map(a => a.patientId))
    const patients = (await Patient.findAll({ include: [{ model: User, as: 'user', where: { active: true } }] }))
      .filter(patient => !withAppointment.has(patient.id) && patient.user)
    // Where every one of them stands, in a fixed number of queries (not one schedule per patient).
    const standings = await computeSchedules(patients.map(p => p.id), clock)
    for (const patient of patients) {
      const schedule = standings.get(patient.id)!
      if (schedule.state === 'not-started' || schedule.daysToDue === null || schedule.daysToDue > PLEASE_BOOK_DAYS) continue
      const user = patient.user!
      const queued = await sequelize.transaction(transaction => enqueueMail({
        ...mailTo(user),
        template: 'pleaseBook',
        params: { name: user.name, date: formatCalendarDate(schedule.dueDate!, user.language), clinic: clock.settings.clinicName },
        linkPath: '/today',
        // Once per due date.
        dedupeKey: `please-book:${patient.id}:${schedule.dueDate}`,
      }, transaction))
      if (queued) pleaseBook++
    }
    const monitoring = await queueMonitoringReminders(clock)
    return { today: clock.today, reminders, pleaseBook, monitoring }
  }),
})
