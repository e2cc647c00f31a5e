import { cancelRequestSchema } from '#shared/schedule/schemas'

/**
 * The patient (or a caregiver he allowed) asks the clinic to cancel the appointment, with an
 * optional note: a request of kind 'cancel' (askAboutAppointment). Staff cancel it with a
 * reason (POST /api/appointments/:id/cancel); he is told by e-mail.
 */
export default defineEventHandler(async (event) => {
  const { access, appointment } = await authorizeAppointment(event, 'appointment.respond')
  const input = await readValidatedBody(event, parseWith(cancelRequestSchema))
  const clock = await scheduleClock()
  const { request, created } = await askAboutAppointment(access, appointment, { kind: 'cancel', preferredDates: [], note: input.note ?? null, requestId: input.requestId ?? null }, clock)
  await appointment.reload()
  setResponseStatus(event, created ? 201 : 200)
  return {
    ...await shapeAppointment(appointment, access.patient.userId, clock.settings.timeZone),
    changeRequest: { id: request.id, status: request.status },
  }
})
