import { Op } from 'sequelize'
import type { Transaction } from 'sequelize'
import { flareWatch, scheduleStatus, suggestSite } from '#shared/schedule/rules'
import { Injection, PatientRegimen, Regimen } from '../../db/models'
import type { ScheduleClock } from './clock'

/*
 * Where a patient stands on the injection schedule today (from the clinical core in
 * shared/schedule/rules.ts): computeSchedules for many patients at once (the due list,
 * the triage queue, the reminder sweep), computeSchedule for one.
 */

export async function currentRegimenOf(patientId: number, transaction?: Transaction) {
  return PatientRegimen.findOne({
    where: { patientId, endsOn: { [Op.is]: null } },
    include: [{ model: Regimen, as: 'regimen' }],
    order: [['startsOn', 'DESC'], ['id', 'DESC']],
    transaction,
  })
}

/** What the standing is made from: the current plan and every injection given, oldest first. */
interface StandingFacts {
  plan: PatientRegimen | null
  injections: Injection[]
}

/** Where one patient stands on the clock's day, from his facts (no I/O). */
function standingOf({ plan, injections }: StandingFacts, clock: ScheduleClock) {
  const first = injections[0]
  const last = injections.at(-1)
  // The dose last given sets the next due date; the plan only when none was given yet.
  const intervalDays = last?.regimen?.intervalDays ?? plan?.regimen?.intervalDays ?? 28
  const status = scheduleStatus({
    lastInjectionDate: last?.givenOn ?? null,
    intervalDays,
    today: clock.today,
    earlyDays: clock.settings.windowEarlyDays,
    lateDays: clock.settings.windowLateDays,
  })
  return {
    regimen: plan?.regimen
      ? { id: plan.regimen.id, name: plan.regimen.name, intervalDays: plan.regimen.intervalDays, startsOn: plan.startsOn }
      : null,
    lastInjection: last ? { date: last.givenOn, site: last.site, regimenName: last.regimen?.name ?? '' } : null,
    ...status,
    suggestedSite: suggestSite(injections.map(i => ({ site: i.site, date: i.givenOn }))),
    flareWatch: flareWatch(first?.givenOn ?? null, clock.today, clock.settings.flareWatchDays),
  }
}

export type PatientStanding = ReturnType<typeof standingOf>

/**
 * Where the patients stand on the clock's day, without the appointment: one function for
 * the schedule page, the triage item, the due list and the daily sweeps. Two queries
 * whatever the number of patients: their current plans and their injections (each with
 * its regimen). Every id asked for is in the answer (with no plan and no injection, he
 * has not started).
 */
export async function computeSchedules(patientIds: readonly number[], clock: ScheduleClock, transaction?: Transaction): Promise<Map<number, PatientStanding>> {
  const ids = [...new Set(patientIds)]
  const facts = new Map<number, StandingFacts>(ids.map(id => [id, { plan: null, injections: [] }]))
  if (!ids.length) return new Map()
  const [plans, injections] = await Promise.all([
    PatientRegimen.findAll({
      where: { patientId: ids, endsOn: { [Op.is]: null } },
      include: [{ model: Regimen, as: 'regimen' }],
      order: [['startsOn', 'ASC'], ['id', 'ASC']],
      transaction,
    }),
    Injection.findAll({
      where: { patientId: ids },
      attributes: ['id', 'patientId', 'regimenId', 'givenAt', 'givenOn', 'site'],
      include: [{ model: Regimen, as: 'regimen', attributes: ['id', 'name', 'intervalDays'] }],
      order: [['givenAt', 'ASC'], ['id', 'ASC']],
      transaction,
    }),
  ])
  // Plans come oldest first, so the one kept is the current plan (latest start, then latest id).
  for (const plan of plans) facts.get(plan.patientId)!.plan = plan
  for (const injection of injections) facts.get(injection.patientId)!.injections.push(injection)
  return new Map([...facts].map(([id, f]) => [id, standingOf(f, clock)]))
}

/** Where one patient stands on the clock's day, without the appointment. */
export async function computeSchedule(patientId: number, clock: ScheduleClock, transaction?: Transaction): Promise<PatientStanding> {
  return (await computeSchedules([patientId], clock, transaction)).get(patientId)!
}
