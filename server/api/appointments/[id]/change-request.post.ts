import { changeRequestSchema, preferredDatesOf } from '#shared/schedule/schemas'

/**
 * The patient (or a caregiver he allowed) asks for another time: up to three preferred
 * dates and a note (askAboutAppointment: one open request, the nurses e-mailed, a retry with
 * the same requestId answers 200 with the first request).
 */
export default defineEventHandler(async (event) => {
  const { access, appointment } = await authorizeAppointment(event, 'appointment.respond')
  const clock = await scheduleClock()
  const input = await readValidatedBody(event, parseWith(changeRequestSchema(clock.today)))
  const { request, created } = await askAboutAppointment(access, appointment, { kind: 'move', preferredDates: preferredDatesOf(input), note: input.note ?? null, requestId: input.requestId ?? null }, clock)
  await appointment.reload()
  setResponseStatus(event, created ? 201 : 200)
  return {
    ...await shapeAppointment(appointment, access.patient.userId, clock.settings.timeZone),
    changeRequest: { id: request.id, status: request.status },
  }
})
