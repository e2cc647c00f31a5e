import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'
import { createdAtColumn, idColumn } from './columns'

/** One of a user's ten one-use recovery codes (salted SHA-256; the code itself is shown once). */
export class TotpRecoveryCode extends Model<InferAttributes<TotpRecoveryCode>, InferCreationAttributes<TotpRecoveryCode>> {
  declare id: CreationOptional<number>
  declare userId: number
  declare codeHash: string
  declare usedAt: Date | null
  declare createdAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    TotpRecoveryCode.init({
      ...idColumn(),
      userId: { type: DataTypes.INTEGER, allowNull: false, field: 'user_id' },
      codeHash: { type: DataTypes.STRING, allowNull: false, field: 'code_hash' },
      usedAt: { type: DataTypes.DATE, allowNull: true, field: 'used_at' },
      ...createdAtColumn(),
    }, { sequelize, tableName: 'totp_recovery_codes', updatedAt: false })
  }
}
