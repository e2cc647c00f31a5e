import { DataTypes } from 'sequelize'
import type { MigrationFn } from './types'

/*
 * Issue 10: invitations and requests for another time carry the id the form made
 * (request_id, unique per patient or per appointment), so a retry or a double click finds
 * the first record instead of storing a second one. An appointment has at most one open
 * request for another time: the partial unique index makes a second one fail even if a
 * route forgot to withdraw the first. Older databases may hold several open ones from
 * before; all but the newest are withdrawn first.
 */
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.addColumn('circle_invitations', 'request_id', { type: DataTypes.STRING, allowNull: true })
  await qi.addIndex('circle_invitations', ['patient_id', 'request_id'], { unique: true, name: 'circle_invitations_patient_request' })
  await qi.addColumn('appointment_change_requests', 'request_id', { type: DataTypes.STRING, allowNull: true })
  await qi.addIndex('appointment_change_requests', ['appointment_id', 'request_id'], { unique: true, name: 'change_requests_appointment_request' })
  await qi.sequelize.query(`
    UPDATE appointment_change_requests SET status = 'withdrawn'
    WHERE status = 'open' AND id NOT IN (
      SELECT MAX(id) FROM appointment_change_requests WHERE status = 'open' GROUP BY appointment_id
    )`)
  await qi.addIndex('appointment_change_requests', ['appointment_id'], { unique: true, name: 'change_requests_one_open', where: { status: 'open' } })
}

/* SQLite's own DROP COLUMN (3.35+), as in 0007: removeColumn would rebuild the tables. */
export const down: MigrationFn = async ({ context: qi }) => {
  await qi.removeIndex('appointment_change_requests', 'change_requests_one_open')
  await qi.removeIndex('appointment_change_requests', 'change_requests_appointment_request')
  await qi.removeIndex('circle_invitations', 'circle_invitations_patient_request')
  await qi.sequelize.query('ALTER TABLE "appointment_change_requests" DROP COLUMN "request_id"')
  await qi.sequelize.query('ALTER TABLE "circle_invitations" DROP COLUMN "request_id"')
}
