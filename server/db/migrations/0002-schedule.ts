import { DataTypes } from 'sequelize'
import type { MigrationFn } from './types'

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
}

/**
 * The injection schedule: regimens (data, not code), each patient's regimen over time,
 * injections given, appointments and the patients' requests for another time.
 */
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('regimens', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    name: { type: DataTypes.STRING, allowNull: false, unique: true },
    interval_days: { type: DataTypes.INTEGER, allowNull: false },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    ...timestamps,
  })
  // The four common regimens (DEFAULT_REGIMENS in shared/schedule/rules.ts, written out
  // here so this migration never changes): every 4, 12, 16 and 24 weeks (US prescribing
  // information of the 1-, 3-, 4- and 6-month depot suspensions, section 2).
  const now = new Date()
  await qi.bulkInsert('regimens', [
    ['1-month depot', 28],
    ['3-month depot', 84],
    ['4-month depot', 112],
    ['6-month depot', 168],
  ].map(([name, days]) => ({ name, interval_days: days, active: true, created_at: now, updated_at: now })))

  await qi.createTable('patient_regimens', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    patient_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'patients', key: 'id' }, onDelete: 'CASCADE' },
    regimen_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'regimens', key: 'id' }, onDelete: 'RESTRICT' },
    starts_on: { type: DataTypes.DATEONLY, allowNull: false },
    ends_on: { type: DataTypes.DATEONLY, allowNull: true },
    set_by_user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' } },
    ...timestamps,
  })
  await qi.addIndex('patient_regimens', ['patient_id', 'ends_on'])

  await qi.createTable('injections', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    patient_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'patients', key: 'id' }, onDelete: 'CASCADE' },
    regimen_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'regimens', key: 'id' }, onDelete: 'RESTRICT' },
    given_at: { type: DataTypes.DATE, allowNull: false },
    given_on: { type: DataTypes.DATEONLY, allowNull: false },
    site: { type: DataTypes.STRING, allowNull: false },
    lot_number: { type: DataTypes.STRING, allowNull: false },
    lot_expires_on: { type: DataTypes.DATEONLY, allowNull: false },
    given_by_user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' } },
    note: { type: DataTypes.TEXT, allowNull: true },
    ...timestamps,
  })
  await qi.addIndex('injections', ['patient_id', 'given_at'])

  await qi.createTable('appointments', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    patient_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'patients', key: 'id' }, onDelete: 'CASCADE' },
    starts_at: { type: DataTypes.DATE, allowNull: false },
    duration_minutes: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 30 },
    place: { type: DataTypes.STRING, allowNull: false },
    status: { type: DataTypes.STRING, allowNull: false, defaultValue: 'booked' },
    sequence: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    confirmed_at: { type: DataTypes.DATE, allowNull: true },
    confirmed_by_user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' } },
    created_by_user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' } },
    ...timestamps,
  })
  await qi.addIndex('appointments', ['patient_id', 'starts_at'])
  await qi.addIndex('appointments', ['status', 'starts_at'])

  await qi.createTable('appointment_change_requests', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    appointment_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'appointments', key: 'id' }, onDelete: 'CASCADE' },
    patient_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'patients', key: 'id' }, onDelete: 'CASCADE' },
    requested_by_user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' } },
    preferred_dates: { type: DataTypes.JSON, allowNull: false },
    note: { type: DataTypes.TEXT, allowNull: true },
    status: { type: DataTypes.STRING, allowNull: false, defaultValue: 'open' },
    decision: { type: DataTypes.STRING, allowNull: true },
    answer_note: { type: DataTypes.TEXT, allowNull: true },
    answered_by_user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' } },
    answered_at: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  })
  await qi.addIndex('appointment_change_requests', ['appointment_id', 'status'])
  await qi.addIndex('appointment_change_requests', ['patient_id', 'status'])
}

export const down: MigrationFn = async ({ context: qi }) => {
  for (const table of ['appointment_change_requests', 'appointments', 'injections', 'patient_regimens', 'regimens']) {
    await qi.dropTable(table)
  }
}
