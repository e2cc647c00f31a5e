import { DataTypes } from 'sequelize'
import type { MigrationFn } from './types'

/*
 * Issue 12, cancelling an appointment: the patient may ask (a request of kind 'cancel', no
 * dates), staff cancel with a reason, kept on the appointment with who and when.
 */
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.addColumn('appointments', 'cancel_reason', { type: DataTypes.TEXT, allowNull: true })
  await qi.addColumn('appointments', 'cancelled_at', { type: DataTypes.DATE, allowNull: true })
  await qi.addColumn('appointments', 'cancelled_by_user_id', { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' } })
  await qi.addColumn('appointment_change_requests', 'kind', { type: DataTypes.STRING, allowNull: false, defaultValue: 'move' })
}

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.removeColumn('appointment_change_requests', 'kind')
  await qi.removeColumn('appointments', 'cancelled_by_user_id')
  await qi.removeColumn('appointments', 'cancelled_at')
  await qi.removeColumn('appointments', 'cancel_reason')
}
