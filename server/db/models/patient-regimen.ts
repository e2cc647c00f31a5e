import { DataTypes } from 'sequelize'
import type { ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { Patient } from './patient'
import type { Regimen } from './regimen'
import type { User } from './user'
import { RecordModel } from './columns'

/** Which regimen a patient is on, from when; the current one has no end date. */
export class PatientRegimen extends RecordModel<InferAttributes<PatientRegimen>, InferCreationAttributes<PatientRegimen>> {
  declare patientId: ForeignKey<Patient['id']>
  declare regimenId: ForeignKey<Regimen['id']>
  declare startsOn: string
  declare endsOn: string | null
  declare setByUserId: ForeignKey<User['id']> | null
  declare regimen?: NonAttribute<Regimen>

  static initModel(sequelize: Sequelize) {
    PatientRegimen.initRecord(sequelize, 'patient_regimens', {
      startsOn: { type: DataTypes.DATEONLY, allowNull: false, field: 'starts_on' },
      endsOn: { type: DataTypes.DATEONLY, allowNull: true, field: 'ends_on' },
      setByUserId: { type: DataTypes.INTEGER, allowNull: true, field: 'set_by_user_id' },
    })
  }
}
