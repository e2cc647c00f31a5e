import { addDays } from '#shared/schedule/rules'
import { MONITORING_REMINDER_DAYS } from '#shared/monitoring/rules'
import { MonitoringItem, Patient, User } from '../../db/models'
import type { ScheduleClock } from '../schedule/clock'

/**
 * Part of the daily reminder task (server/tasks/schedule/reminders.ts): one e-mail to each
 * patient with a planned check due within MONITORING_REMINDER_DAYS or overdue, in his
 * language. It names no test, date or value: only that a check the clinic planned is due and
 * to see Tidewell. Once per earliest due date (the dedupe key), so a check done and the
 * next one coming brings one new e-mail, and running the task twice sends nothing twice.
 */
export async function queueMonitoringReminders(clock: ScheduleClock): Promise<number> {
  const items = await MonitoringItem.findAll({
    where: { active: true },
    include: [{ model: Patient, as: 'patient', attributes: ['id'], include: [{ model: User, as: 'user', where: { active: true } }] }],
  })
  const psa = await psaResultsOf([...new Set(items.map(item => item.patientId))])
  const rises = psaRiseDates(psa)
  const horizon = addDays(clock.today, MONITORING_REMINDER_DAYS)
  const earliest = new Map<number, { dueOn: string, user: User }>()
  for (const item of items) {
    const user = item.patient?.user
    const { dueOn } = dueOf(item, clock.today, rises.get(item.patientId) ?? null)
    if (!user || !dueOn || dueOn > horizon) continue
    const known = earliest.get(item.patientId)
    if (!known || dueOn < known.dueOn) earliest.set(item.patientId, { dueOn, user })
  }
  const sequelize = await useDb()
  let queued = 0
  for (const [patientId, { dueOn, user }] of earliest) {
    const sent = await sequelize.transaction(transaction => enqueueMail({
      ...mailTo(user),
      template: 'monitoringDue',
      params: { name: user.name, clinic: clock.settings.clinicName },
      linkPath: '/labs',
      dedupeKey: `monitoring-due:${patientId}:${dueOn}`,
    }, transaction))
    if (sent) queued++
  }
  return queued
}

