import { DataTypes } from 'sequelize'
import type { MigrationFn } from './types'

/**
 * Care circle: invitations a patient (or staff on his behalf) sends to a caregiver, with
 * the permissions the grant will carry; who last changed and who removed each grant; and
 * an index for the admin audit page's date filter.
 */
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('circle_invitations', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    patient_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'patients', key: 'id' }, onDelete: 'CASCADE' },
    email: { type: DataTypes.STRING, allowNull: false },
    name: { type: DataTypes.STRING, allowNull: false },
    language: { type: DataTypes.STRING, allowNull: false, defaultValue: 'en' },
    can_log_diary: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    can_manage_appointments: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    invited_by_user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' } },
    status: { type: DataTypes.STRING, allowNull: false, defaultValue: 'pending' },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    accepted_by_user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' } },
    grant_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'care_grants', key: 'id' } },
    closed_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('circle_invitations', ['patient_id', 'status'])
  await qi.addColumn('care_grants', 'updated_by_user_id', { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' } })
  await qi.addColumn('care_grants', 'revoked_by_user_id', { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' } })
  await qi.addIndex('audit_events', ['at'])
}

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.removeIndex('audit_events', ['at'])
  await qi.removeColumn('care_grants', 'revoked_by_user_id')
  await qi.removeColumn('care_grants', 'updated_by_user_id')
  await qi.dropTable('circle_invitations')
}
