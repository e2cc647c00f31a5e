import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'
import { idColumn } from './columns'

/** A message received by the local mail catcher (development and demo only). */
export class CaughtMail extends Model<InferAttributes<CaughtMail>, InferCreationAttributes<CaughtMail>> {
  declare id: CreationOptional<number>
  declare from: string
  declare to: string
  declare subject: string
  declare text: string
  declare receivedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    CaughtMail.init({
      ...idColumn(),
      from: { type: DataTypes.STRING, allowNull: false, field: 'from_address' },
      to: { type: DataTypes.STRING, allowNull: false, field: 'to_address' },
      subject: { type: DataTypes.STRING, allowNull: false },
      text: { type: DataTypes.TEXT, allowNull: false },
      receivedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW, field: 'received_at' },
    }, { sequelize, tableName: 'caught_mail', timestamps: false })
  }
}
