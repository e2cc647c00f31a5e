import { Op } from 'sequelize'
import type { Transaction } from 'sequelize'
import type { SiteCode } from '#shared/schedule/rules'
import { OPEN_APPOINTMENT_STATUSES } from '#shared/schedule/statuses'
import type { InjectionView } from '#shared/schedule/views'
import type { Patient, Regimen } from '../../db/models'
import { Appointment, Injection, PatientRegimen } from '../../db/models'
import type { ScheduleClock } from './clock'
import { startOfClinicDay } from './clock'
import { computeSchedule, currentRegimenOf } from './standing'

/** One injection as the pages see it (regimen and givenBy included by the query). */
export function shapeInjection(injection: Injection): InjectionView {
  return {
    id: injection.id,
    givenAt: injection.givenAt.toISOString(),
    givenOn: injection.givenOn,
    site: injection.site,
    lotNumber: injection.lotNumber,
    lotExpiresOn: injection.lotExpiresOn,
    regimen: { id: injection.regimen?.id ?? injection.regimenId, name: injection.regimen?.name ?? '' },
    givenBy: injection.givenBy?.name ?? '',
    note: injection.note,
  }
}

/** One dose given, as the injection form and the visit's give step record it. */
export interface InjectionRecord {
  patient: Patient
  user: { id: number }
  regimen: Regimen
  givenAt: Date
  givenOn: string
  site: SiteCode
  lotNumber: string
  lotExpiresOn: string
  note: string | null
}

/**
 * Records one injection inside the caller's transaction: refuses a second one on the same
 * day (400 on `date`); the dose given becomes the patient's regimen when it is his newest,
 * and the open appointments it fulfils (before the next window opens) are closed.
 */
export async function recordInjection(record: InjectionRecord, clock: ScheduleClock, transaction: Transaction): Promise<Injection> {
  const { patient, user, regimen } = record
  const sameDay = await Injection.findOne({ where: { patientId: patient.id, givenOn: record.givenOn }, transaction })
  if (sameDay) throw fieldError('date', 'validation.schedule.alreadyRecorded')
  const latest = await Injection.findOne({ where: { patientId: patient.id }, order: [['givenAt', 'DESC']], transaction })
  const created = await Injection.create({
    patientId: patient.id,
    regimenId: regimen.id,
    givenAt: record.givenAt,
    givenOn: record.givenOn,
    site: record.site,
    lotNumber: record.lotNumber.toUpperCase(),
    lotExpiresOn: record.lotExpiresOn,
    givenByUserId: user.id,
    note: record.note,
  }, { transaction })

  // The newest dose decides the regimen from now on.
  const isNewest = !latest || latest.givenOn <= record.givenOn
  const plan = await currentRegimenOf(patient.id, transaction)
  if (isNewest && plan?.regimenId !== regimen.id) {
    if (plan) await plan.update({ endsOn: record.givenOn }, { transaction })
    await PatientRegimen.create({ patientId: patient.id, regimenId: regimen.id, startsOn: record.givenOn, endsOn: null, setByUserId: user.id }, { transaction })
  }

  // Open appointments before the next window opens were for this dose.
  const schedule = await computeSchedule(patient.id, clock, transaction)
  if (isNewest && schedule.windowOpens) {
    await Appointment.update({ status: 'done' }, {
      where: {
        patientId: patient.id,
        status: { [Op.in]: [...OPEN_APPOINTMENT_STATUSES] },
        startsAt: { [Op.lt]: startOfClinicDay(schedule.windowOpens, clock.settings.timeZone) },
      },
      transaction,
    })
  }
  return created
}
