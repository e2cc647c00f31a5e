import { setRegimenSchema } from '#shared/schedule/schemas'
import { PatientRegimen, Regimen } from '../../../db/models'

/** Puts the patient on a regimen from a date (nurses and clinicians); the old one ends then. */
export default defineEventHandler(async (event) => {
  const { patient, user } = await authorizePatient(event, idParam(event), 'regimen.set')
  const input = await readValidatedBody(event, parseWith(setRegimenSchema))
  const regimen = await Regimen.findOne({ where: { id: input.regimenId, active: true } })
  if (!regimen) throw fieldError('regimenId', 'validation.schedule.regimenRequired')
  const sequelize = await useDb()
  await sequelize.transaction(async (transaction) => {
    const plan = await currentRegimenOf(patient.id, transaction)
    if (plan) await plan.update({ endsOn: input.startsOn }, { transaction })
    await PatientRegimen.create({ patientId: patient.id, regimenId: regimen.id, startsOn: input.startsOn, endsOn: null, setByUserId: user.id }, { transaction })
  })
  return { id: regimen.id, name: regimen.name, intervalDays: regimen.intervalDays, startsOn: input.startsOn }
})
