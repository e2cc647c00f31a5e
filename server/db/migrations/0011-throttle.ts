import { DataTypes } from 'sequelize'
import type { MigrationFn } from './types'

/*
 * Issue 11, throttling kept in the database so it survives a restart
 * (server/utils/auth/sign-in-limit.ts, server/utils/auth/throttle.ts):
 * - sign_in_failures gets the client address (hashed) beside the account, so failures are
 *   counted per account, per address and per pair;
 * - throttle_hits counts requests per scope and key (forgot-password per address and per
 *   IP, set-password per IP, circle invitations per patient and per invited address);
 * - reset_requests is the queue of forgot-password requests, worked off in the background
 *   so the answer takes the same time whether or not the address has an account.
 */
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.addColumn('sign_in_failures', 'ip_key', { type: DataTypes.STRING, allowNull: true })
  await qi.addIndex('sign_in_failures', ['ip_key', 'at'], { name: 'sign_in_failures_ip_at' })
  await qi.createTable('throttle_hits', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    scope: { type: DataTypes.STRING, allowNull: false },
    key: { type: DataTypes.STRING, allowNull: false },
    at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('throttle_hits', ['scope', 'key', 'at'], { name: 'throttle_hits_scope_key_at' })
  await qi.addIndex('throttle_hits', ['at'], { name: 'throttle_hits_at' })
  await qi.createTable('reset_requests', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    email: { type: DataTypes.STRING, allowNull: false },
    // Whether the per-address limit still allowed an e-mail when the request came in.
    may_send: { type: DataTypes.BOOLEAN, allowNull: false },
    requested_at: { type: DataTypes.DATE, allowNull: false },
  })
}

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('reset_requests')
  await qi.dropTable('throttle_hits')
  await qi.removeIndex('sign_in_failures', 'sign_in_failures_ip_at')
  await qi.removeColumn('sign_in_failures', 'ip_key')
}
