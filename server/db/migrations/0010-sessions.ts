import { DataTypes } from 'sequelize'
import type { MigrationFn } from './types'

/*
 * Issue 11, revocable sessions (server/utils/auth/sessions.ts): the sealed session cookie
 * carries the id of one user_sessions row, and every signed-in request needs that row to
 * be live. Signing out, "sign out everywhere", a password change, a deactivation and the
 * idle timeout end rows (ended_at, ended_reason); a copied cookie then answers 401.
 * The id is random (24 bytes, base64url) and never leaves the server: it sits in the
 * sealed part of the cookie that nuxt-auth-utils does not send to the client.
 */
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('user_sessions', {
    id: { type: DataTypes.STRING, primaryKey: true },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    created_at: { type: DataTypes.DATE, allowNull: false },
    ended_at: { type: DataTypes.DATE, allowNull: true },
    // sign-out, sign-out-everywhere, password-changed, deactivated, idle
    ended_reason: { type: DataTypes.STRING, allowNull: true },
    // The browser, shortened, so a person can tell his sessions apart later.
    user_agent: { type: DataTypes.STRING, allowNull: true },
  })
  await qi.addIndex('user_sessions', ['user_id', 'ended_at'], { name: 'user_sessions_user_ended' })
}

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('user_sessions')
}
