import type { Sequelize } from 'sequelize'
import { AuditEvent } from './audit-event'
import { CareGrant } from './care-grant'
import { CaughtMail } from './caught-mail'
import { ClinicSetting } from './clinic-setting'
import { OneTimeToken } from './one-time-token'
import { OutboxMessage } from './outbox-message'
import { Patient } from './patient'
import { SignInFailure } from './sign-in-failure'
import { User } from './user'

export { AuditEvent, CareGrant, CaughtMail, ClinicSetting, OneTimeToken, OutboxMessage, Patient, SignInFailure, User }

/** Registers every model and its associations on one connection. */
export function initModels(sequelize: Sequelize) {
  for (const model of [User, Patient, CareGrant, AuditEvent, OutboxMessage, OneTimeToken, SignInFailure, CaughtMail, ClinicSetting]) {
    model.initModel(sequelize)
  }
  User.hasOne(Patient, { foreignKey: { name: 'userId', field: 'user_id', allowNull: false }, as: 'patient' })
  Patient.belongsTo(User, { foreignKey: { name: 'userId', field: 'user_id', allowNull: false }, as: 'user' })
  Patient.hasMany(CareGrant, { foreignKey: { name: 'patientId', field: 'patient_id', allowNull: false }, as: 'grants' })
  CareGrant.belongsTo(Patient, { foreignKey: { name: 'patientId', field: 'patient_id', allowNull: false }, as: 'patient' })
  CareGrant.belongsTo(User, { foreignKey: { name: 'caregiverUserId', field: 'caregiver_user_id', allowNull: false }, as: 'caregiver' })
  CareGrant.belongsTo(User, { foreignKey: { name: 'grantedByUserId', field: 'granted_by_user_id', allowNull: false }, as: 'grantedBy' })
}
