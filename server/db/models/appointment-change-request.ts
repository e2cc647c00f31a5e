import { DataTypes } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { ChangeDecision, ChangeRequestKind, ChangeRequestStatus } from '#shared/schedule/statuses'
import type { Appointment } from './appointment'
import type { Patient } from './patient'
import type { User } from './user'
import { FormRecordModel, requestIdColumn, statusColumn } from './columns'

/** A patient's (or caregiver's) request for another appointment time, and the answer. */
export class AppointmentChangeRequest extends FormRecordModel<InferAttributes<AppointmentChangeRequest>, InferCreationAttributes<AppointmentChangeRequest>> {
  declare appointmentId: ForeignKey<Appointment['id']>
  declare patientId: ForeignKey<Patient['id']>
  declare requestedByUserId: ForeignKey<User['id']>
  /** move: another time (preferredDates); cancel: no appointment at all (no dates). */
  declare kind: CreationOptional<ChangeRequestKind>
  declare preferredDates: string[]
  declare note: string | null
  declare status: CreationOptional<ChangeRequestStatus>
  declare decision: ChangeDecision | 'cancel' | null
  declare answerNote: string | null
  declare answeredByUserId: ForeignKey<User['id']> | null
  declare answeredAt: Date | null
  declare requestedBy?: NonAttribute<User>
  declare appointment?: NonAttribute<Appointment>
  declare patient?: NonAttribute<Patient>
  declare answeredBy?: NonAttribute<User | null>

  static initModel(sequelize: Sequelize) {
    AppointmentChangeRequest.initRecord(sequelize, 'appointment_change_requests', {
      kind: { type: DataTypes.STRING, allowNull: false, defaultValue: 'move' },
      preferredDates: { type: DataTypes.JSON, allowNull: false, field: 'preferred_dates' },
      note: { type: DataTypes.TEXT, allowNull: true },
      ...statusColumn('open'),
      decision: { type: DataTypes.STRING, allowNull: true },
      answerNote: { type: DataTypes.TEXT, allowNull: true, field: 'answer_note' },
      answeredAt: { type: DataTypes.DATE, allowNull: true, field: 'answered_at' },
      ...requestIdColumn(),
    })
  }
}
