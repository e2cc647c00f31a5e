import { DataTypes } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { Language, Role } from '#shared/auth/roles'
import type { Patient } from './patient'
import { RecordModel } from './columns'

export class User extends RecordModel<InferAttributes<User>, InferCreationAttributes<User>> {
  declare email: string
  declare passwordHash: string | null
  declare role: Role
  declare name: string
  declare language: Language
  declare active: CreationOptional<boolean>
  /** His own phone (a caregiver's number the nurse can call); patients keep theirs on the patient record. */
  declare phone: CreationOptional<string | null>
  /** Second factor (migration 0012, server/utils/auth/totp.ts): secrets AES-256-GCM encrypted, never sent out after enrolment. */
  declare totpSecret: CreationOptional<string | null>
  declare totpPendingSecret: CreationOptional<string | null>
  declare totpEnabledAt: CreationOptional<Date | null>
  declare totpLastStep: CreationOptional<number | null>
  declare totpFailures: CreationOptional<number>
  declare totpFailedAt: CreationOptional<Date | null>
  declare patient?: NonAttribute<Patient | null>

  static initModel(sequelize: Sequelize) {
    User.initRecord(sequelize, 'users', {
      email: { type: DataTypes.STRING, allowNull: false, unique: true },
      passwordHash: { type: DataTypes.STRING, allowNull: true, field: 'password_hash' },
      role: { type: DataTypes.STRING, allowNull: false },
      name: { type: DataTypes.STRING, allowNull: false },
      language: { type: DataTypes.STRING, allowNull: false, defaultValue: 'en' },
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      phone: { type: DataTypes.STRING, allowNull: true },
      totpSecret: { type: DataTypes.TEXT, allowNull: true, field: 'totp_secret' },
      totpPendingSecret: { type: DataTypes.TEXT, allowNull: true, field: 'totp_pending_secret' },
      totpEnabledAt: { type: DataTypes.DATE, allowNull: true, field: 'totp_enabled_at' },
      totpLastStep: { type: DataTypes.INTEGER, allowNull: true, field: 'totp_last_step' },
      totpFailures: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0, field: 'totp_failures' },
      totpFailedAt: { type: DataTypes.DATE, allowNull: true, field: 'totp_failed_at' },
    })
  }
}
