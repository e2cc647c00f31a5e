import { DataTypes, Model } from 'sequelize'
import type { InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'

/** One clinic setting (key and JSON value); defaults live in server/utils/core/settings.ts. */
export class ClinicSetting extends Model<InferAttributes<ClinicSetting>, InferCreationAttributes<ClinicSetting>> {
  declare key: string
  declare value: unknown

  static initModel(sequelize: Sequelize) {
    ClinicSetting.init({
      key: { type: DataTypes.STRING, primaryKey: true },
      value: { type: DataTypes.JSON, allowNull: false },
    }, { sequelize, tableName: 'clinic_settings', timestamps: false })
  }
}
