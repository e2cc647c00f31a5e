import { DataTypes } from 'sequelize'
import type { MigrationFn } from './types'

/*
 * Issue 11, a second factor (TOTP, RFC 6238) for staff, optional for patients and
 * caregivers (server/utils/auth/totp.ts):
 * - users.totp_secret: the confirmed secret, AES-256-GCM encrypted (never returned after
 *   enrolment); users.totp_pending_secret: the one shown on the enrolment page until a code
 *   confirms it; users.totp_enabled_at; users.totp_last_step: the last accepted time step,
 *   so a code is accepted once (replay);
 * - users.totp_failures / totp_failed_at: wrong codes in a row, for the wait after 5;
 * - totp_recovery_codes: ten one-use codes per user, salted SHA-256, spent by used_at.
 */
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.addColumn('users', 'totp_secret', { type: DataTypes.TEXT, allowNull: true })
  await qi.addColumn('users', 'totp_pending_secret', { type: DataTypes.TEXT, allowNull: true })
  await qi.addColumn('users', 'totp_enabled_at', { type: DataTypes.DATE, allowNull: true })
  await qi.addColumn('users', 'totp_last_step', { type: DataTypes.INTEGER, allowNull: true })
  await qi.addColumn('users', 'totp_failures', { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 })
  await qi.addColumn('users', 'totp_failed_at', { type: DataTypes.DATE, allowNull: true })
  await qi.createTable('totp_recovery_codes', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    code_hash: { type: DataTypes.STRING, allowNull: false },
    used_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('totp_recovery_codes', ['user_id'], { name: 'totp_recovery_codes_user' })
}

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('totp_recovery_codes')
  for (const column of ['totp_failed_at', 'totp_failures', 'totp_last_step', 'totp_enabled_at', 'totp_pending_secret', 'totp_secret']) {
    await qi.removeColumn('users', column)
  }
}
