import { changeRequestSchema, preferredDatesOf } from '../../../../shared/schemas/schedule'
import { AppointmentChangeRequest } from '../../../db/models'

/**
 * The patient (or a caregiver he allowed) asks for another time: up to three preferred
 * dates and a note. The nurses on duty get an e-mail (no names in it); staff answer on the
 * patient's page.
 */
export default defineEventHandler(async (event) => {
  const { access, appointment } = await authorizeAppointment(event, 'appointment.respond')
  const clock = await scheduleClock()
  const input = await readValidatedBody(event, parseWith(changeRequestSchema(clock.today)))
  assertAppointmentOpen(appointment, clock.now)
  const sequelize = await useDb()
  await sequelize.transaction(async (transaction) => {
    await AppointmentChangeRequest.update({ status: 'withdrawn' }, {
      where: { appointmentId: appointment.id, patientId: access.patient.id, status: 'open' },
      transaction,
    })
    const request = await AppointmentChangeRequest.create({
      appointmentId: appointment.id,
      patientId: access.patient.id,
      requestedByUserId: access.user.id,
      preferredDates: preferredDatesOf(input),
      note: input.note ?? null,
      decision: null,
      answerNote: null,
      answeredByUserId: null,
      answeredAt: null,
    }, { transaction })
    await appointment.update({ status: 'change-requested', confirmedAt: null, confirmedByUserId: null }, { transaction })
    for (const nurse of clock.settings.nursesOnDuty) {
      await enqueueMail({
        to: nurse,
        template: 'scheduleChangeAsked',
        language: 'en',
        params: { clinicNumber: access.patient.clinicNumber },
        linkPath: `/staff/patients/${access.patient.id}`,
        dedupeKey: `change-asked:${request.id}:${nurse}`,
      }, transaction)
    }
  })
  setResponseStatus(event, 201)
  return shapeAppointment(appointment, access.patient.userId, clock.settings.timeZone)
})
