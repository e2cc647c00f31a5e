import { Op } from 'sequelize'
import { zonedDateTimeToUtc } from '#shared/schedule/rules'
import { recordInjectionSchema } from '#shared/schedule/schemas'
import { OPEN_APPOINTMENT_STATUSES } from '#shared/schedule/statuses'
import { Appointment, Injection, PatientRegimen, Regimen, User } from '../../../db/models'

/** Minutes a clock may run ahead before a time counts as "in the future". */
const CLOCK_TOLERANCE_MS = 5 * 60_000

/**
 * Records one injection given (nurses and clinicians). Refuses a date or time in the
 * future, an unknown regimen and a second injection on the same day. The dose given
 * becomes the patient's regimen, and open appointments it fulfils are closed.
 */
export default defineEventHandler(async (event) => {
  const { patient, user } = await authorizePatient(event, idParam(event), 'injection.record')
  const clock = await scheduleClock()
  const input = await readValidatedBody(event, parseWith(recordInjectionSchema(clock.today)))
  const givenAt = zonedDateTimeToUtc(input.date, input.time, clock.settings.timeZone)
  if (givenAt.getTime() > clock.now.getTime() + CLOCK_TOLERANCE_MS) throw fieldError('time', 'validation.schedule.futureTime')
  const regimen = await Regimen.findOne({ where: { id: input.regimenId, active: true } })
  if (!regimen) throw fieldError('regimenId', 'validation.schedule.regimenRequired')

  const sequelize = await useDb()
  const injection = await sequelize.transaction(async (transaction) => {
    const sameDay = await Injection.findOne({ where: { patientId: patient.id, givenOn: input.date }, transaction })
    if (sameDay) throw fieldError('date', 'validation.schedule.alreadyRecorded')
    const latest = await Injection.findOne({ where: { patientId: patient.id }, order: [['givenAt', 'DESC']], transaction })
    const created = await Injection.create({
      patientId: patient.id,
      regimenId: regimen.id,
      givenAt,
      givenOn: input.date,
      site: input.site,
      lotNumber: input.lotNumber.toUpperCase(),
      lotExpiresOn: input.lotExpiresOn,
      givenByUserId: user.id,
      note: input.note ?? null,
    }, { transaction })

    // The newest dose decides the regimen from now on.
    const isNewest = !latest || latest.givenOn <= input.date
    const plan = await currentRegimenOf(patient.id, transaction)
    if (isNewest && plan?.regimenId !== regimen.id) {
      if (plan) await plan.update({ endsOn: input.date }, { transaction })
      await PatientRegimen.create({ patientId: patient.id, regimenId: regimen.id, startsOn: input.date, endsOn: null, setByUserId: user.id }, { transaction })
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
  })

  const saved = await Injection.findOne({
    where: { id: injection.id, patientId: patient.id },
    include: [{ model: Regimen, as: 'regimen', attributes: ['id', 'name'] }, { model: User, as: 'givenBy', attributes: ['name'] }],
  })
  setResponseStatus(event, 201)
  return shapeInjection(saved!)
})
