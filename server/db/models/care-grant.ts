import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { Patient } from './patient'
import type { User } from './user'
import { createdAtColumn, idColumn, updatedAtColumn } from './columns'

/** A patient's permission for one caregiver (the care circle). Viewing is implied. */
export class CareGrant extends Model<InferAttributes<CareGrant>, InferCreationAttributes<CareGrant>> {
  declare id: CreationOptional<number>
  declare patientId: ForeignKey<Patient['id']>
  declare caregiverUserId: ForeignKey<User['id']>
  declare canLogDiary: boolean
  declare canManageAppointments: boolean
  declare grantedByUserId: ForeignKey<User['id']>
  declare revokedAt: Date | null
  /** Who last changed the permissions (the patient, or staff on his behalf). */
  declare updatedByUserId: ForeignKey<User['id']> | null
  /** Who removed the caregiver. */
  declare revokedByUserId: ForeignKey<User['id']> | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare caregiver?: NonAttribute<User>
  declare grantedBy?: NonAttribute<User>
  declare patient?: NonAttribute<Patient>

  static initModel(sequelize: Sequelize) {
    CareGrant.init({
      ...idColumn(),
      canLogDiary: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false, field: 'can_log_diary' },
      canManageAppointments: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false, field: 'can_manage_appointments' },
      revokedAt: { type: DataTypes.DATE, allowNull: true, field: 'revoked_at' },
      ...createdAtColumn(),
      ...updatedAtColumn(),
    }, { sequelize, tableName: 'care_grants' })
  }
}
