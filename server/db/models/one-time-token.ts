import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'
import { createdAtColumn, idColumn } from './columns'

export const TOKEN_PURPOSES = ['invite', 'reset', 'circle-invite'] as const
export type TokenPurpose = (typeof TOKEN_PURPOSES)[number]

/** A single-use link token. Only its SHA-256 hash is stored. */
export class OneTimeToken extends Model<InferAttributes<OneTimeToken>, InferCreationAttributes<OneTimeToken>> {
  declare id: CreationOptional<number>
  declare userId: number | null
  declare purpose: TokenPurpose
  declare tokenHash: string
  declare data: CreationOptional<Record<string, unknown>>
  declare expiresAt: Date
  declare usedAt: Date | null
  declare createdAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    OneTimeToken.init({
      ...idColumn(),
      userId: { type: DataTypes.INTEGER, allowNull: true, field: 'user_id' },
      purpose: { type: DataTypes.STRING, allowNull: false },
      tokenHash: { type: DataTypes.STRING, allowNull: false, unique: true, field: 'token_hash' },
      data: { type: DataTypes.JSON, allowNull: false, defaultValue: {} },
      expiresAt: { type: DataTypes.DATE, allowNull: false, field: 'expires_at' },
      usedAt: { type: DataTypes.DATE, allowNull: true, field: 'used_at' },
      ...createdAtColumn(),
    }, { sequelize, tableName: 'one_time_tokens', updatedAt: false })
  }
}
