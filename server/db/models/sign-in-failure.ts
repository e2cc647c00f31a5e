import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'
import { idColumn } from './columns'

/** A failed sign-in, kept in the database so the lockout survives a restart. */
export class SignInFailure extends Model<InferAttributes<SignInFailure>, InferCreationAttributes<SignInFailure>> {
  declare id: CreationOptional<number>
  declare accountKey: string
  declare ipKey: CreationOptional<string | null>
  declare at: Date

  static initModel(sequelize: Sequelize) {
    SignInFailure.init({
      ...idColumn(),
      accountKey: { type: DataTypes.STRING, allowNull: false, field: 'account_key' },
      ipKey: { type: DataTypes.STRING, allowNull: true, field: 'ip_key' },
      at: { type: DataTypes.DATE, allowNull: false },
    }, { sequelize, tableName: 'sign_in_failures', timestamps: false })
  }
}
