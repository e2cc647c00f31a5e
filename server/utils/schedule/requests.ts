import { createError } from 'h3'
import { Op } from 'sequelize'
import type { ChangeRequestKind } from '#shared/schedule/statuses'
import { OPEN_APPOINTMENT_STATUSES } from '#shared/schedule/statuses'
import type { Appointment } from '../../db/models'
import { Appointment as AppointmentModel, AppointmentChangeRequest } from '../../db/models'
import type { PatientAccess } from '../auth/access'
import type { ScheduleClock } from './clock'

/*
 * The patient's requests about an appointment (another time, or to cancel) and the clinic's
 * cancellation.
 */

export interface AppointmentAsk {
  kind: ChangeRequestKind
  preferredDates: string[]
  note: string | null
  requestId: string | null
}

/**
 * The patient (or a caregiver he allowed) asks about an appointment: another time, or to
 * cancel it. The nurses on duty get an e-mail (no names in it); staff answer on the patient's
 * page. An appointment has one open request: a new one withdraws the earlier. The same
 * requestId again (a retry, a double click) returns the request the first try stored, with
 * no second e-mail. The appointment moves to 'change-requested' only if it is still open at
 * that moment (a conditional update; 409 otherwise).
 */
export function askAboutAppointment(access: PatientAccess, appointment: Appointment, ask: AppointmentAsk, clock: ScheduleClock) {
  return inDraftTransaction(async (transaction) => {
    if (ask.requestId) {
      const first = await AppointmentChangeRequest.findOne({ where: { appointmentId: appointment.id, requestId: ask.requestId }, transaction })
      if (first) return { request: first, created: false }
    }
    const [moved] = await AppointmentModel.update({ status: 'change-requested', confirmedAt: null, confirmedByUserId: null }, {
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
      kind: ask.kind,
      preferredDates: ask.preferredDates,
      note: ask.note,
      decision: null,
      answerNote: null,
      answeredByUserId: null,
      answeredAt: null,
      requestId: ask.requestId,
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
}
