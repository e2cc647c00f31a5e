import { DataTypes } from 'sequelize'
import type { ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { SiteCode } from '#shared/schedule/rules'
import type { Patient } from './patient'
import type { Regimen } from './regimen'
import type { User } from './user'
import { RecordModel } from './columns'

/**
 * One depot injection given. givenAt is the instant; givenOn is its calendar date in the
 * clinic's time zone, the date the schedule counts from.
 */
export class Injection extends RecordModel<InferAttributes<Injection>, InferCreationAttributes<Injection>> {
  declare patientId: ForeignKey<Patient['id']>
  declare regimenId: ForeignKey<Regimen['id']>
  declare givenAt: Date
  declare givenOn: string
  declare site: SiteCode
  declare lotNumber: string
  declare lotExpiresOn: string
  declare givenByUserId: ForeignKey<User['id']>
  declare note: string | null
  declare regimen?: NonAttribute<Regimen>
  declare givenBy?: NonAttribute<User>

  static initModel(sequelize: Sequelize) {
    Injection.initRecord(sequelize, 'injections', {
      givenAt: { type: DataTypes.DATE, allowNull: false, field: 'given_at' },
      givenOn: { type: DataTypes.DATEONLY, allowNull: false, field: 'given_on' },
      site: { type: DataTypes.STRING, allowNull: false },
      lotNumber: { type: DataTypes.STRING, allowNull: false, field: 'lot_number' },
      lotExpiresOn: { type: DataTypes.DATEONLY, allowNull: false, field: 'lot_expires_on' },
      note: { type: DataTypes.TEXT, allowNull: true },
    })
  }
}
