import { DataTypes } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'
import { RecordModel } from './columns'

/** A depot regimen: a generic name and the days between injections. Data, not code. */
export class Regimen extends RecordModel<InferAttributes<Regimen>, InferCreationAttributes<Regimen>> {
  declare name: string
  declare intervalDays: number
  declare active: CreationOptional<boolean>

  static initModel(sequelize: Sequelize) {
    Regimen.initRecord(sequelize, 'regimens', {
      name: { type: DataTypes.STRING, allowNull: false, unique: true },
      intervalDays: { type: DataTypes.INTEGER, allowNull: false, field: 'interval_days' },
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    })
  }
}
