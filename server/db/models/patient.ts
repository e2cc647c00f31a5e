import { DataTypes } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { ContactPreference, PatientPhone } from '#shared/contact/schemas'
import type { User } from './user'
import { RecordModel } from './columns'

export class Patient extends RecordModel<InferAttributes<Patient>, InferCreationAttributes<Patient>> {
  declare userId: ForeignKey<User['id']>
  declare clinicNumber: string
  declare dateOfBirth: string
  /** Set by nurses and clinicians; read it through riskProfileOf() (null or older = all false). */
  declare riskProfile: CreationOptional<Record<string, boolean> | null>
  declare phones: CreationOptional<PatientPhone[]>
  declare bestTimesToCall: CreationOptional<string>
  declare preferredContact: CreationOptional<ContactPreference>
  declare user?: NonAttribute<User>

  static initModel(sequelize: Sequelize) {
    Patient.initRecord(sequelize, 'patients', {
      clinicNumber: { type: DataTypes.STRING, allowNull: false, unique: true, field: 'clinic_number' },
      dateOfBirth: { type: DataTypes.DATEONLY, allowNull: false, field: 'date_of_birth' },
      riskProfile: { type: DataTypes.JSON, allowNull: true, field: 'risk_profile' },
      phones: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
      bestTimesToCall: { type: DataTypes.STRING(200), allowNull: false, defaultValue: '', field: 'best_times_to_call' },
      preferredContact: { type: DataTypes.STRING, allowNull: false, defaultValue: 'phone', field: 'preferred_contact' },
    })
  }
}
