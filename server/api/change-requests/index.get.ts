import type { ChangeRequestListRow } from '#shared/schedule/views'
import { Appointment, AppointmentChangeRequest, Patient, User } from '../../db/models'

/**
 * Every open request for another appointment time across the clinic (staff), oldest first:
 * who asked, for which appointment, the dates he prefers. Answered on his page. One query,
 * one audit line per man listed.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireRole(event, ['nurse', 'clinician', 'admin'])
  const requests = await AppointmentChangeRequest.findAll({
    where: { status: 'open' },
    include: [
      { model: Appointment, as: 'appointment', attributes: ['id', 'startsAt', 'place'] },
      { model: Patient, as: 'patient', attributes: ['id', 'clinicNumber', 'userId'], include: [{ model: User, as: 'user', attributes: ['name'] }] },
      { model: User, as: 'requestedBy', attributes: ['id', 'name', 'role'] },
    ],
    order: [['createdAt', 'ASC'], ['id', 'ASC']],
  })
  const rows: ChangeRequestListRow[] = requests.map(request => ({
    id: request.id,
    kind: request.kind,
    patient: { id: request.patientId, name: request.patient?.user?.name ?? '', clinicNumber: request.patient?.clinicNumber ?? '' },
    appointment: { id: request.appointmentId, startsAt: request.appointment?.startsAt.toISOString() ?? '', place: request.appointment?.place ?? '' },
    preferredDates: request.preferredDates,
    note: request.note,
    createdAt: request.createdAt.toISOString(),
    requestedBy: request.requestedBy && request.patient ? attributionOf(request.requestedBy, request.patient.userId) : null,
  }))
  await recordListAudit(event, { actor, action: 'change-requests.read', resource: `${event.method} ${event.path}` }, [...new Set(rows.map(r => r.patient.id))])
  return { rows }
})
