import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'
import { idColumn } from './columns'

/** One line of the audit trail: who saw or changed what, when and from where. */
export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<number>
  declare actorUserId: number | null
  declare actorRole: string | null
  declare patientId: number | null
  declare action: string
  declare resource: string
  declare outcome: CreationOptional<string>
  declare ip: string | null
  declare at: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    AuditEvent.init({
      ...idColumn(),
      actorUserId: { type: DataTypes.INTEGER, allowNull: true, field: 'actor_user_id' },
      actorRole: { type: DataTypes.STRING, allowNull: true, field: 'actor_role' },
      patientId: { type: DataTypes.INTEGER, allowNull: true, field: 'patient_id' },
      action: { type: DataTypes.STRING, allowNull: false },
      resource: { type: DataTypes.STRING, allowNull: false },
      outcome: { type: DataTypes.STRING, allowNull: false, defaultValue: 'done' },
      ip: { type: DataTypes.STRING, allowNull: true },
      at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    }, { sequelize, tableName: 'audit_events', timestamps: false })
  }
}
