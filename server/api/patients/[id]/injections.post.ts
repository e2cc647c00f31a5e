import { zonedDateTimeToUtc } from '#shared/schedule/rules'
import { recordInjectionSchema } from '#shared/schedule/schemas'
import { Injection, Regimen, User } from '../../../db/models'

/** Minutes a clock may run ahead before a time counts as "in the future". */
const CLOCK_TOLERANCE_MS = 5 * 60_000

/**
 * Records one injection given (nurses and clinicians). Refuses a date or time in the
 * future, an unknown regimen and a second injection on the same day (recordInjection).
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
  const injection = await sequelize.transaction(transaction => recordInjection({
    patient,
    user,
    regimen,
    givenAt,
    givenOn: input.date,
    site: input.site,
    lotNumber: input.lotNumber,
    lotExpiresOn: input.lotExpiresOn,
    note: input.note ?? null,
  }, clock, transaction))

  const saved = await Injection.findOne({
    where: { id: injection.id, patientId: patient.id },
    include: [{ model: Regimen, as: 'regimen', attributes: ['id', 'name'] }, { model: User, as: 'givenBy', attributes: ['name'] }],
  })
  setResponseStatus(event, 201)
  return shapeInjection(saved!)
})
