import { DataTypes } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { Language } from '#shared/auth/roles'
import type { CareGrant } from './care-grant'
import type { Patient } from './patient'
import type { User } from './user'
import { FormRecordModel, requestIdColumn, statusColumn } from './columns'

export const INVITATION_STATUSES = ['pending', 'accepted', 'cancelled'] as const
export type InvitationStatus = (typeof INVITATION_STATUSES)[number]

/**
 * An invitation to join a patient's care circle, sent by e-mail with a single-use link
 * (OneTimeToken purpose 'circle-invite', data.invitationId). Accepting it creates the grant.
 */
export class CircleInvitation extends FormRecordModel<InferAttributes<CircleInvitation>, InferCreationAttributes<CircleInvitation>> {
  declare patientId: ForeignKey<Patient['id']>
  declare email: string
  declare name: string
  declare language: Language
  declare canLogDiary: boolean
  declare canManageAppointments: boolean
  declare canMessage: CreationOptional<boolean>
  declare invitedByUserId: ForeignKey<User['id']>
  declare status: CreationOptional<InvitationStatus>
  declare expiresAt: Date
  declare acceptedByUserId: ForeignKey<User['id']> | null
  declare grantId: ForeignKey<CareGrant['id']> | null
  declare closedAt: Date | null
  declare invitedBy?: NonAttribute<User>
  declare patient?: NonAttribute<Patient>

  static initModel(sequelize: Sequelize) {
    CircleInvitation.initRecord(sequelize, 'circle_invitations', {
      email: { type: DataTypes.STRING, allowNull: false },
      name: { type: DataTypes.STRING, allowNull: false },
      language: { type: DataTypes.STRING, allowNull: false, defaultValue: 'en' },
      canLogDiary: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false, field: 'can_log_diary' },
      canManageAppointments: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false, field: 'can_manage_appointments' },
      canMessage: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false, field: 'can_message' },
      ...statusColumn('pending'),
      expiresAt: { type: DataTypes.DATE, allowNull: false, field: 'expires_at' },
      closedAt: { type: DataTypes.DATE, allowNull: true, field: 'closed_at' },
      ...requestIdColumn(),
    })
  }
}
