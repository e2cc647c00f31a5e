import { DataTypes } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { Patient } from './patient'
import type { User } from './user'
import { RecordModel } from './columns'

/** A patient's permission for one caregiver (the care circle). Viewing is implied. */
export class CareGrant extends RecordModel<InferAttributes<CareGrant>, InferCreationAttributes<CareGrant>> {
  declare patientId: ForeignKey<Patient['id']>
  declare caregiverUserId: ForeignKey<User['id']>
  declare canLogDiary: boolean
  declare canManageAppointments: boolean
  declare canMessage: CreationOptional<boolean>
  declare grantedByUserId: ForeignKey<User['id']>
  declare revokedAt: Date | null
  /** Who last changed the permissions (the patient, or staff on his behalf). */
  declare updatedByUserId: ForeignKey<User['id']> | null
  /** Who removed the caregiver. */
  declare revokedByUserId: ForeignKey<User['id']> | null
  declare caregiver?: NonAttribute<User>
  declare grantedBy?: NonAttribute<User>
  declare patient?: NonAttribute<Patient>

  static initModel(sequelize: Sequelize) {
    CareGrant.initRecord(sequelize, 'care_grants', {
      canLogDiary: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false, field: 'can_log_diary' },
      canManageAppointments: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false, field: 'can_manage_appointments' },
      canMessage: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false, field: 'can_message' },
      revokedAt: { type: DataTypes.DATE, allowNull: true, field: 'revoked_at' },
    })
  }
}
