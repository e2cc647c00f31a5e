import type { Transaction } from 'sequelize'
import { FULFILLED_BY_LAB, doneAfter, planFromDefaults } from '#shared/monitoring/rules'
import type { MonitoringKind } from '#shared/monitoring/rules'
import { addDays } from '#shared/schedule/rules'
import { RISK_FACTORS, riskProfileOf } from '#shared/triage/risk-profile'
import { monitoringRegimenOf } from '../../utils/monitoring/monitoring'
import { LabResult, MonitoringItem, MonitoringPlan, Patient, User } from '../models'
import { demoToday } from './labs'

/*
 * A monitoring plan for every demo patient with a regimen, from the clinic defaults, owned
 * by the demo clinician. A check is done on the day of his newest demo result of its kind,
 * blood pressure and weight at his last injection, and the few checks below on invented
 * days, and every other check as a baseline on the day his regimen started, so "Monitoring
 * due" shows overdue checks, checks due this month and later ones.
 */
const DEMO_CHECKS_DONE: Record<string, Partial<Record<MonitoringKind, number>>> = {
  'LPU-1001': { 'bone-density': 400, 'vitamin-d': 300, 'lipids': 200, 'glucose': 170 },
  'LPU-1003': { glucose: 200, lipids: 380 },
  'LPU-1007': { 'bone-density': 120, 'vitamin-d': 120 },
  'LPU-1008': { 'bone-density': 800, 'lipids': 90 },
  'LPU-1010': { ecg: 190, electrolytes: 190, lipids: 40 },
}

export async function seedDemoMonitoring(transaction: Transaction) {
  const today = await demoToday(transaction)
  const owner = await User.findOne({ where: { role: 'clinician' }, order: [['id', 'ASC']], transaction })
  if (!owner) return
  for (const patient of await Patient.findAll({ order: [['id', 'ASC']], transaction })) {
    const regimen = await monitoringRegimenOf(patient.id, transaction)
    if (!regimen) continue
    const profile = riskProfileOf(patient.riskProfile)
    const done = new Map<MonitoringKind, string>()
    const mark = (kind: MonitoringKind, on: string) => done.set(kind, doneAfter(done.get(kind) ?? null, on))
    for (const result of await LabResult.findAll({ where: { patientId: patient.id }, attributes: ['kind', 'takenOn'], transaction })) mark(FULFILLED_BY_LAB[result.kind], result.takenOn)
    if (regimen.start.lastInjectionOn) {
      mark('blood-pressure', regimen.start.lastInjectionOn)
      mark('weight', regimen.start.lastInjectionOn)
    }
    for (const [kind, daysAgo] of Object.entries(DEMO_CHECKS_DONE[patient.clinicNumber] ?? {})) mark(kind as MonitoringKind, addDays(today, -daysAgo))
    // Every other check was done once, as a baseline, when his regimen started.
    const baseline = regimen.start.startsOn <= today ? regimen.start.startsOn : null
    const plan = await MonitoringPlan.create({ patientId: patient.id, ownerUserId: owner.id, regimenId: regimen.regimenId }, { transaction })
    const items = planFromDefaults(regimen.start, today, RISK_FACTORS.filter(factor => profile[factor]))
    await MonitoringItem.bulkCreate(items.map(item => ({ ...item, planId: plan.id, patientId: patient.id, lastDoneOn: done.get(item.kind) ?? baseline })), { transaction })
  }
}
