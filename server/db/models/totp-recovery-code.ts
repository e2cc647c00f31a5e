import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'

/** One of a user's ten one-use recovery codes (salted SHA-256; the code itself is shown once). */
export class TotpRecoveryCode extends Model<InferAttributes<TotpRecoveryCode>, InferCreationAttributes<TotpRecoveryCode>> {
  declare id: CreationOptional<number>
  declare userId: number
  declare codeHash: string
  declare usedAt: Date | null
  declare createdAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    TotpRecoveryCode.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      userId: { type: DataTypes.INTEGER, allowNull: false, field: 'user_id' },
      codeHash: { type: DataTypes.STRING, allowNull: false, field: 'code_hash' },
      usedAt: { type: DataTypes.DATE, allowNull: true, field: 'used_at' },
      createdAt: { type: DataTypes.DATE, field: 'created_at' },
    }, { sequelize, tableName: 'totp_recovery_codes', updatedAt: false })
  }
}
