import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { Language } from '#shared/auth/roles'
import type { CareGrant } from './care-grant'
import type { Patient } from './patient'
import type { User } from './user'
import { createdAtColumn, idColumn, updatedAtColumn } from './columns'

export const INVITATION_STATUSES = ['pending', 'accepted', 'cancelled'] as const
export type InvitationStatus = (typeof INVITATION_STATUSES)[number]

/**
 * An invitation to join a patient's care circle, sent by e-mail with a single-use link
 * (OneTimeToken purpose 'circle-invite', data.invitationId). Accepting it creates the grant.
 */
export class CircleInvitation extends Model<InferAttributes<CircleInvitation>, InferCreationAttributes<CircleInvitation>> {
  declare id: CreationOptional<number>
  declare patientId: ForeignKey<Patient['id']>
  declare email: string
  declare name: string
  declare language: Language
  declare canLogDiary: boolean
  declare canManageAppointments: boolean
  declare invitedByUserId: ForeignKey<User['id']>
  declare status: CreationOptional<InvitationStatus>
  declare expiresAt: Date
  declare acceptedByUserId: ForeignKey<User['id']> | null
  declare grantId: ForeignKey<CareGrant['id']> | null
  declare closedAt: Date | null
  /** The id the form made (uuid), so a retry finds this record; null from older clients. */
  declare requestId: CreationOptional<string | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare invitedBy?: NonAttribute<User>
  declare patient?: NonAttribute<Patient>

  static initModel(sequelize: Sequelize) {
    CircleInvitation.init({
      ...idColumn(),
      email: { type: DataTypes.STRING, allowNull: false },
      name: { type: DataTypes.STRING, allowNull: false },
      language: { type: DataTypes.STRING, allowNull: false, defaultValue: 'en' },
      canLogDiary: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false, field: 'can_log_diary' },
      canManageAppointments: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false, field: 'can_manage_appointments' },
      status: { type: DataTypes.STRING, allowNull: false, defaultValue: 'pending' },
      expiresAt: { type: DataTypes.DATE, allowNull: false, field: 'expires_at' },
      closedAt: { type: DataTypes.DATE, allowNull: true, field: 'closed_at' },
      requestId: { type: DataTypes.STRING, allowNull: true, field: 'request_id' },
      ...createdAtColumn(),
      ...updatedAtColumn(),
    }, { sequelize, tableName: 'circle_invitations' })
  }
}
