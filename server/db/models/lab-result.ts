import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { LabKind } from '#shared/labs/lab-triage'
import type { Patient } from './patient'
import type { User } from './user'
import { createdAtColumn, idColumn } from './columns'

/**
 * One lab or ECG result entered by staff. value is in unit: testosterone ng/dL or nmol/L
 * as reported, PSA ng/mL, HbA1c %, QTc the measured QT in ms with the heart rate beside it.
 */
export class LabResult extends Model<InferAttributes<LabResult>, InferCreationAttributes<LabResult>> {
  declare id: CreationOptional<number>
  declare patientId: ForeignKey<Patient['id']>
  declare kind: LabKind
  declare takenOn: string
  declare value: number
  declare unit: string
  declare heartRate: number | null
  declare note: string | null
  declare enteredByUserId: ForeignKey<User['id']>
  declare createdAt: CreationOptional<Date>
  declare enteredBy?: NonAttribute<User>

  static initModel(sequelize: Sequelize) {
    LabResult.init({
      ...idColumn(),
      kind: { type: DataTypes.STRING, allowNull: false },
      takenOn: { type: DataTypes.DATEONLY, allowNull: false, field: 'taken_on' },
      value: { type: DataTypes.DOUBLE, allowNull: false },
      unit: { type: DataTypes.STRING, allowNull: false },
      heartRate: { type: DataTypes.DOUBLE, allowNull: true, field: 'heart_rate' },
      note: { type: DataTypes.TEXT, allowNull: true },
      ...createdAtColumn(),
    }, { sequelize, tableName: 'lab_results', updatedAt: false })
  }
}
