import type { H3Event } from 'h3'
import { createError } from 'h3'
import { Appointment } from '../../db/models'
import type { PatientAction } from '../auth/access'

/* Who may act on an appointment: the appointment's patient, through authorizePatient. */

/**
 * Loads the appointment named in the route and authorises one action on its patient.
 * An appointment that does not exist, or whose patient the user may not see, answers 404.
 */
export async function authorizeAppointment(event: H3Event, action: PatientAction) {
  await useDb()
  const id = idParam(event)
  const found = id ? await Appointment.findByPk(id) : null
  const access = await authorizePatient(event, found?.patientId ?? 0, action)
  const appointment = await Appointment.findOne({ where: { id, patientId: access.patient.id } })
  if (!appointment) throw createError({ statusCode: 404, message: 'errors.notFound' })
  return { access, appointment }
}
