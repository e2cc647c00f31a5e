import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { User } from './user'
import { createdAtColumn } from './columns'

export const SESSION_END_REASONS = ['sign-out', 'sign-out-everywhere', 'password-changed', 'deactivated', 'idle'] as const
export type SessionEndReason = (typeof SESSION_END_REASONS)[number]

/** One signed-in session (its id is in the sealed cookie); live while endedAt is null. */
export class UserSession extends Model<InferAttributes<UserSession>, InferCreationAttributes<UserSession>> {
  declare id: string
  declare userId: number
  declare createdAt: CreationOptional<Date>
  declare endedAt: Date | null
  declare endedReason: SessionEndReason | null
  declare userAgent: string | null
  declare user?: NonAttribute<User>

  static initModel(sequelize: Sequelize) {
    UserSession.init({
      id: { type: DataTypes.STRING, primaryKey: true },
      userId: { type: DataTypes.INTEGER, allowNull: false, field: 'user_id' },
      ...createdAtColumn(),
      endedAt: { type: DataTypes.DATE, allowNull: true, field: 'ended_at' },
      endedReason: { type: DataTypes.STRING, allowNull: true, field: 'ended_reason' },
      userAgent: { type: DataTypes.STRING, allowNull: true, field: 'user_agent' },
    }, { sequelize, tableName: 'user_sessions', updatedAt: false })
  }
}
