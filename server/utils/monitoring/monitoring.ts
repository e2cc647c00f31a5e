import { Op } from 'sequelize'
import type { Transaction } from 'sequelize'
import { interpretLab } from '#shared/labs/lab-triage'
import type { LabReading } from '#shared/labs/lab-triage'
import type { LabResultView } from '#shared/labs/views'
import { FULFILLED_BY_LAB, MONITORING_DEFAULTS, dueState, nextDueOn } from '#shared/monitoring/rules'
import type { MonitoringKind, PlanItem, RegimenStart } from '#shared/monitoring/rules'
import type { MonitoringItemView, MonitoringPlanView } from '#shared/monitoring/views'
import { Injection, LabResult, MonitoringItem, MonitoringPlan, Regimen, User } from '../../db/models'
import type { PatientAccess } from '../auth/access'
import type { ScheduleClock } from '../schedule/clock'

/*
 * The monitoring plan's server work: his plan with its items, what is due, the results
 * that fulfil an item, and the view each reader gets. The rules are in
 * shared/monitoring/rules.ts.
 */

export async function monitoringPlanOf(patientId: number, transaction?: Transaction) {
  return MonitoringPlan.findOne({
    where: { patientId },
    include: [
      { model: MonitoringItem, as: 'items' },
      { model: User, as: 'owner', attributes: ['id', 'name'] },
      { model: Regimen, as: 'regimen', attributes: ['id', 'name'] },
    ],
    order: [[{ model: MonitoringItem, as: 'items' }, 'id', 'ASC']],
    transaction,
  })
}

/** His current regimen with its start and his last injection on it, as the defaults read them. */
export async function monitoringRegimenOf(patientId: number, transaction?: Transaction): Promise<{ regimenId: number, name: string, start: RegimenStart } | null> {
  const current = await currentRegimenOf(patientId, transaction)
  if (!current?.regimen) return null
  const last = await Injection.findOne({ where: { patientId, givenOn: { [Op.gte]: current.startsOn } }, order: [['givenOn', 'DESC']], attributes: ['givenOn'], transaction })
  return {
    regimenId: current.regimen.id,
    name: current.regimen.name,
    start: { cycleDays: current.regimen.intervalDays, startsOn: current.startsOn, lastInjectionOn: last?.givenOn ?? null },
  }
}

/**
 * The newest day each patient's PSA was found rising (its doubling time fitted from the
 * nadir is positive), from PSA results given oldest first: a testosterone check is due then.
 */
export function psaRiseDates(psaResults: readonly LabResult[]): Map<number, string> {
  const byPatient = new Map<number, LabReading[]>()
  for (const result of psaResults) {
    const readings = byPatient.get(result.patientId) ?? []
    readings.push({ id: result.id, kind: 'psa', takenOn: result.takenOn, value: result.value, unit: result.unit, heartRate: null })
    byPatient.set(result.patientId, readings)
  }
  const rises = new Map<number, string>()
  for (const [patientId, history] of byPatient) {
    for (const reading of history) {
      const meaning = interpretLab(reading, { history, firstInjectionOn: null })
      if (meaning.kind === 'psa' && meaning.doubling.status === 'rising') rises.set(patientId, reading.takenOn)
    }
  }
  return rises
}

export async function psaResultsOf(patientIds: readonly number[] | null, transaction?: Transaction) {
  return LabResult.findAll({
    where: { kind: 'psa', ...(patientIds ? { patientId: { [Op.in]: [...patientIds] } } : {}) },
    order: [['takenOn', 'ASC'], ['id', 'ASC']],
    attributes: ['id', 'patientId', 'takenOn', 'value', 'unit'],
    transaction,
  })
}

/** When an item is due and how it stands today; nothing for an inactive one. */
export function dueOf(item: MonitoringItem, today: string, psaRiseOn: string | null) {
  if (!item.active) return { dueOn: null, state: null }
  const dueOn = nextDueOn(item, psaRiseOn ?? null)
  return { dueOn, state: dueState(dueOn, today) }
}

/** The plan's items as the rules read them (to apply the defaults again). */
export function planItemsOf(items: readonly MonitoringItem[]): PlanItem[] {
  return items.map(({ kind, intervalDays, firstDueOn, lastDoneOn, active, note }) => ({ kind, intervalDays, firstDueOn, lastDoneOn, active, note }))
}

/**
 * Writes the items into the plan: an item of a kind already there is updated (its last-done
 * date kept unless given), a new kind created, and with `replace` a kind left out removed.
 */
export async function saveMonitoringItems(plan: MonitoringPlan, items: readonly (Omit<PlanItem, 'lastDoneOn'> & { lastDoneOn?: string | null })[], transaction: Transaction, options: { replace: boolean }) {
  const existing = await MonitoringItem.findAll({ where: { planId: plan.id }, transaction })
  for (const item of items) {
    const found = existing.find(row => row.kind === item.kind)
    const values = { intervalDays: item.intervalDays, firstDueOn: item.firstDueOn, active: item.active, note: item.note }
    if (found) await found.update({ ...values, ...(item.lastDoneOn !== undefined ? { lastDoneOn: item.lastDoneOn } : {}) }, { transaction })
    else await MonitoringItem.create({ planId: plan.id, patientId: plan.patientId, kind: item.kind, lastDoneOn: item.lastDoneOn ?? null, ...values }, { transaction })
  }
  if (options.replace) {
    const kept = new Set(items.map(item => item.kind))
    const gone = existing.filter(row => !kept.has(row.kind)).map(row => row.id)
    if (gone.length) await MonitoringItem.destroy({ where: { id: { [Op.in]: gone } }, transaction })
  }
  plan.changed('updatedAt', true)
  await plan.save({ transaction })
}

/**
 * A result entered in Tidewell, or a check marked done, on `doneOn`: the item of that kind
 * is done then, unless it was already done later. Returns whether an item changed.
 */
export async function fulfilMonitoringItem(patientId: number, kind: MonitoringKind, doneOn: string, transaction: Transaction): Promise<boolean> {
  const [count] = await MonitoringItem.update({ lastDoneOn: doneOn }, {
    where: { patientId, kind, [Op.or]: [{ lastDoneOn: { [Op.is]: null } }, { lastDoneOn: { [Op.lt]: doneOn } }] },
    transaction,
  })
  return count > 0
}

/** A clinician who may own a plan, or a 400 on the field. */
export async function requireClinicianOwner(userId: number, transaction?: Transaction): Promise<User> {
  const owner = await User.findOne({ where: { id: userId, role: 'clinician', active: true }, attributes: ['id', 'name'], transaction })
  if (!owner) throw fieldError('ownerUserId', 'validation.monitoring.ownerRequired')
  return owner
}

/** The staff view of his plan, with the newest result of each kind Tidewell stores. */
export async function monitoringPlanView(access: PatientAccess, clock: ScheduleClock, transaction?: Transaction): Promise<MonitoringPlanView> {
  const patientId = access.patient.id
  const [plan, regimen, labs, clinicians] = await Promise.all([
    monitoringPlanOf(patientId, transaction),
    monitoringRegimenOf(patientId, transaction),
    labContextOf(patientId, transaction),
    User.findAll({ where: { role: 'clinician', active: true }, attributes: ['id', 'name'], order: [['name', 'ASC']], transaction }),
  ])
  const views = labs.results.map(result => labResultView(result, labs.context))
  const psaRiseOn = psaRiseDates(labs.results.filter(result => result.kind === 'psa')).get(patientId) ?? null
  const lastResultOf = (kind: MonitoringKind): LabResultView | null =>
    views.filter(view => FULFILLED_BY_LAB[view.kind] === kind).at(-1) ?? null
  const items = (plan?.items ?? []).map((item): MonitoringItemView => ({
    id: item.id,
    kind: item.kind,
    intervalDays: item.intervalDays,
    firstDueOn: item.firstDueOn,
    lastDoneOn: item.lastDoneOn,
    active: item.active,
    note: item.note,
    ...dueOf(item, clock.today, psaRiseOn),
    lastResult: lastResultOf(item.kind),
    sources: [...(MONITORING_DEFAULTS.find(entry => entry.kind === item.kind)?.sources ?? [])],
  }))
  return {
    patientId,
    today: clock.today,
    plan: plan
      ? {
          owner: { id: plan.owner?.id ?? plan.ownerUserId, name: plan.owner?.name ?? '' },
          regimenName: plan.regimen?.name ?? null,
          regimenChanged: regimen !== null && plan.regimenId !== regimen.regimenId,
          updatedAt: plan.updatedAt.toISOString(),
          items,
        }
      : null,
    regimenName: regimen?.name ?? null,
    can: { manage: access.allows('monitoring.manage'), markDone: access.allows('labs.record') },
    clinicians: clinicians.map(user => ({ id: user.id, name: user.name })),
  }
}
