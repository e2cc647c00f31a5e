import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'
import { createdAtColumn, idColumn, updatedAtColumn } from './columns'

/** A depot regimen: a generic name and the days between injections. Data, not code. */
export class Regimen extends Model<InferAttributes<Regimen>, InferCreationAttributes<Regimen>> {
  declare id: CreationOptional<number>
  declare name: string
  declare intervalDays: number
  declare active: CreationOptional<boolean>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    Regimen.init({
      ...idColumn(),
      name: { type: DataTypes.STRING, allowNull: false, unique: true },
      intervalDays: { type: DataTypes.INTEGER, allowNull: false, field: 'interval_days' },
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      ...createdAtColumn(),
      ...updatedAtColumn(),
    }, { sequelize, tableName: 'regimens' })
  }
}
