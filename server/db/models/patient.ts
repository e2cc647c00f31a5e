import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { User } from './user'

export class Patient extends Model<InferAttributes<Patient>, InferCreationAttributes<Patient>> {
  declare id: CreationOptional<number>
  declare userId: ForeignKey<User['id']>
  declare clinicNumber: string
  declare dateOfBirth: string
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare user?: NonAttribute<User>

  static initModel(sequelize: Sequelize) {
    Patient.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      clinicNumber: { type: DataTypes.STRING, allowNull: false, unique: true, field: 'clinic_number' },
      dateOfBirth: { type: DataTypes.DATEONLY, allowNull: false, field: 'date_of_birth' },
      createdAt: { type: DataTypes.DATE, field: 'created_at' },
      updatedAt: { type: DataTypes.DATE, field: 'updated_at' },
    }, { sequelize, tableName: 'patients' })
  }
}
