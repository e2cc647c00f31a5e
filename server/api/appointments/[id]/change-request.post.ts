import { Op } from 'sequelize'
import { changeRequestSchema, preferredDatesOf } from '#shared/schedule/schemas'
import { OPEN_APPOINTMENT_STATUSES } from '#shared/schedule/statuses'
import { Appointment, AppointmentChangeRequest } from '../../../db/models'

/**
 * The patient (or a caregiver he allowed) asks for another time: up to three preferred
 * dates and a note. The nurses on duty get an e-mail (no names in it); staff answer on the
 * patient's page. An appointment has one open request: a new one withdraws the earlier.
 * The same requestId again (a retry, a double click) returns the request the first try
 * stored, 200, with no second e-mail. The appointment moves to 'change-requested' only
 * if it is still open at that moment (a conditional update; 409 otherwise).
 */
export default defineEventHandler(async (event) => {
  const { access, appointment } = await authorizeAppointment(event, 'appointment.respond')
  const clock = await scheduleClock()
  const input = await readValidatedBody(event, parseWith(changeRequestSchema(clock.today)))
  const { request, created } = await inDraftTransaction(async (transaction) => {
    if (input.requestId) {
      const first = await AppointmentChangeRequest.findOne({ where: { appointmentId: appointment.id, requestId: input.requestId }, transaction })
      if (first) return { request: first, created: false }
    }
    const [moved] = await Appointment.update({ status: 'change-requested', confirmedAt: null, confirmedByUserId: null }, {
      where: { id: appointment.id, patientId: access.patient.id, status: { [Op.in]: [...OPEN_APPOINTMENT_STATUSES] }, startsAt: { [Op.gt]: clock.now } },
      transaction,
    })
    if (!moved) {
      await appointment.reload({ transaction })
      assertAppointmentOpen(appointment, clock.now)
      throw createError({ statusCode: 409, message: 'errors.schedule.appointmentClosed' })
    }
    await AppointmentChangeRequest.update({ status: 'withdrawn' }, {
      where: { appointmentId: appointment.id, patientId: access.patient.id, status: 'open' },
      transaction,
    })
    const stored = await AppointmentChangeRequest.create({
      appointmentId: appointment.id,
      patientId: access.patient.id,
      requestedByUserId: access.user.id,
      preferredDates: preferredDatesOf(input),
      note: input.note ?? null,
      decision: null,
      answerNote: null,
      answeredByUserId: null,
      answeredAt: null,
      requestId: input.requestId ?? null,
    }, { transaction })
    for (const nurse of clock.settings.nursesOnDuty) {
      await enqueueMail({
        to: nurse,
        template: 'scheduleChangeAsked',
        language: 'en',
        params: { clinicNumber: access.patient.clinicNumber },
        linkPath: `/staff/patients/${access.patient.id}`,
        dedupeKey: `change-asked:${stored.id}:${nurse}`,
      }, transaction)
    }
    return { request: stored, created: true }
  })
  await appointment.reload()
  setResponseStatus(event, created ? 201 : 200)
  return {
    ...await shapeAppointment(appointment, access.patient.userId, clock.settings.timeZone),
    changeRequest: { id: request.id, status: request.status },
  }
})
