import { Injection, Regimen, User } from '../../../db/models'
import type { InjectionView } from '#shared/schedule/views'

/** The patient's injection history, newest first, with the sites used. */
export default defineEventHandler(async (event): Promise<InjectionView[]> => {
  const { patient } = await authorizePatient(event, idParam(event), 'patient.read')
  const injections = await Injection.findAll({
    where: { patientId: patient.id },
    include: [
      { model: Regimen, as: 'regimen', attributes: ['id', 'name'] },
      { model: User, as: 'givenBy', attributes: ['name'] },
    ],
    order: [['givenAt', 'DESC'], ['id', 'DESC']],
  })
  return injections.map(injection => shapeInjection(injection))
})
