import { DataTypes } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { AppointmentStatus } from '#shared/schedule/statuses'
import type { Patient } from './patient'
import type { User } from './user'
import type { AppointmentChangeRequest } from './appointment-change-request'
import { RecordModel, statusColumn } from './columns'

/**
 * An injection appointment, stored as a UTC instant and shown in the clinic's time zone.
 * sequence counts the times it was moved (the iCalendar SEQUENCE of its calendar file).
 */
export class Appointment extends RecordModel<InferAttributes<Appointment>, InferCreationAttributes<Appointment>> {
  declare patientId: ForeignKey<Patient['id']>
  declare startsAt: Date
  declare durationMinutes: number
  declare place: string
  declare status: CreationOptional<AppointmentStatus>
  declare sequence: CreationOptional<number>
  declare confirmedAt: Date | null
  declare confirmedByUserId: ForeignKey<User['id']> | null
  declare createdByUserId: ForeignKey<User['id']> | null
  declare cancelReason: CreationOptional<string | null>
  declare cancelledAt: CreationOptional<Date | null>
  declare cancelledByUserId: CreationOptional<ForeignKey<User['id']> | null>
  declare confirmedBy?: NonAttribute<User | null>
  declare patient?: NonAttribute<Patient>
  declare changeRequests?: NonAttribute<AppointmentChangeRequest[]>

  static initModel(sequelize: Sequelize) {
    Appointment.initRecord(sequelize, 'appointments', {
      startsAt: { type: DataTypes.DATE, allowNull: false, field: 'starts_at' },
      durationMinutes: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 30, field: 'duration_minutes' },
      place: { type: DataTypes.STRING, allowNull: false },
      ...statusColumn('booked'),
      sequence: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      confirmedAt: { type: DataTypes.DATE, allowNull: true, field: 'confirmed_at' },
      cancelReason: { type: DataTypes.TEXT, allowNull: true, field: 'cancel_reason' },
      cancelledAt: { type: DataTypes.DATE, allowNull: true, field: 'cancelled_at' },
    })
  }
}
