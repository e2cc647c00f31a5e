import { DataTypes } from 'sequelize'
import { jsonDefault } from './dialect'
import type { MigrationFn } from './types'

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
}

export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('users', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    email: { type: DataTypes.STRING, allowNull: false, unique: true },
    password_hash: { type: DataTypes.STRING, allowNull: true },
    role: { type: DataTypes.STRING, allowNull: false },
    name: { type: DataTypes.STRING, allowNull: false },
    language: { type: DataTypes.STRING, allowNull: false, defaultValue: 'en' },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    ...timestamps,
  })
  await qi.createTable('patients', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    user_id: { type: DataTypes.INTEGER, allowNull: false, unique: true, references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' },
    clinic_number: { type: DataTypes.STRING, allowNull: false, unique: true },
    date_of_birth: { type: DataTypes.DATEONLY, allowNull: false },
    ...timestamps,
  })
  await qi.createTable('care_grants', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    patient_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'patients', key: 'id' }, onDelete: 'CASCADE' },
    caregiver_user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    granted_by_user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' } },
    can_log_diary: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    can_manage_appointments: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    revoked_at: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  })
  await qi.addIndex('care_grants', ['caregiver_user_id', 'patient_id'])
  await qi.createTable('audit_events', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    actor_user_id: { type: DataTypes.INTEGER, allowNull: true },
    actor_role: { type: DataTypes.STRING, allowNull: true },
    patient_id: { type: DataTypes.INTEGER, allowNull: true },
    action: { type: DataTypes.STRING, allowNull: false },
    resource: { type: DataTypes.STRING, allowNull: false },
    outcome: { type: DataTypes.STRING, allowNull: false, defaultValue: 'allowed' },
    ip: { type: DataTypes.STRING, allowNull: true },
    at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('audit_events', ['patient_id', 'at'])
  await qi.addIndex('audit_events', ['actor_user_id', 'at'])
  await qi.createTable('outbox_messages', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    to_address: { type: DataTypes.STRING, allowNull: false },
    subject: { type: DataTypes.STRING, allowNull: false },
    text: { type: DataTypes.TEXT, allowNull: false },
    html: { type: DataTypes.TEXT, allowNull: false },
    attachments: { type: DataTypes.JSON, allowNull: false, defaultValue: jsonDefault(qi, '[]') },
    dedupe_key: { type: DataTypes.STRING, allowNull: true, unique: true },
    status: { type: DataTypes.STRING, allowNull: false, defaultValue: 'pending' },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    next_attempt_at: { type: DataTypes.DATE, allowNull: false },
    last_error: { type: DataTypes.TEXT, allowNull: true },
    sent_at: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  })
  await qi.addIndex('outbox_messages', ['status', 'next_attempt_at'])
  await qi.createTable('one_time_tokens', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    purpose: { type: DataTypes.STRING, allowNull: false },
    token_hash: { type: DataTypes.STRING, allowNull: false, unique: true },
    data: { type: DataTypes.JSON, allowNull: false, defaultValue: jsonDefault(qi, '{}') },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.createTable('sign_in_failures', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    account_key: { type: DataTypes.STRING, allowNull: false },
    at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('sign_in_failures', ['account_key', 'at'])
  await qi.createTable('caught_mail', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    from_address: { type: DataTypes.STRING, allowNull: false },
    to_address: { type: DataTypes.STRING, allowNull: false },
    subject: { type: DataTypes.STRING, allowNull: false },
    text: { type: DataTypes.TEXT, allowNull: false },
    received_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.createTable('clinic_settings', {
    key: { type: DataTypes.STRING, primaryKey: true },
    value: { type: DataTypes.JSON, allowNull: false },
  })
}

export const down: MigrationFn = async ({ context: qi }) => {
  for (const table of ['clinic_settings', 'caught_mail', 'sign_in_failures', 'one_time_tokens', 'outbox_messages', 'audit_events', 'care_grants', 'patients', 'users']) {
    await qi.dropTable(table)
  }
}
