import { DataTypes } from 'sequelize'
import type { MigrationFn } from './types'

/*
 * Issue 12, the injection visit: a visit (an appointment's or a walk-in's) with its checks
 * before the kit, and the kits prepared for it. A kit thrown away stays as a record with its
 * lot and never becomes an injection; the one given links the visit to its injection.
 */
export const up: MigrationFn = async ({ context: qi }) => {
  const user = (allowNull: boolean) => ({ type: DataTypes.INTEGER, allowNull, references: { model: 'users', key: 'id' } })
  await qi.createTable('visits', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    patient_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'patients', key: 'id' }, onDelete: 'CASCADE' },
    appointment_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'appointments', key: 'id' } },
    visit_date: { type: DataTypes.DATEONLY, allowNull: false },
    status: { type: DataTypes.STRING, allowNull: false, defaultValue: 'here' },
    opened_by_user_id: user(false),
    checked_at: { type: DataTypes.DATE, allowNull: true },
    checked_by_user_id: user(true),
    hypersensitivity: { type: DataTypes.BOOLEAN, allowNull: true },
    right_now: { type: DataTypes.JSON, allowNull: true },
    window_check: { type: DataTypes.JSON, allowNull: true },
    window_reason: { type: DataTypes.TEXT, allowNull: true },
    not_given_reason: { type: DataTypes.STRING, allowNull: true },
    not_given_note: { type: DataTypes.TEXT, allowNull: true },
    injection_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'injections', key: 'id' } },
    mix_gap_minutes: { type: DataTypes.INTEGER, allowNull: true },
    late_mix_acknowledged: { type: DataTypes.BOOLEAN, allowNull: true },
    observation_note: { type: DataTypes.TEXT, allowNull: true },
    next_appointment_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'appointments', key: 'id' } },
    triage_item_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'triage_items', key: 'id' } },
    closed_at: { type: DataTypes.DATE, allowNull: true },
    closed_by_user_id: user(true),
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('visits', ['visit_date'])
  await qi.addIndex('visits', ['patient_id', 'visit_date'])
  await qi.createTable('visit_kits', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    visit_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'visits', key: 'id' }, onDelete: 'CASCADE' },
    patient_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'patients', key: 'id' }, onDelete: 'CASCADE' },
    regimen_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'regimens', key: 'id' } },
    gtin: { type: DataTypes.STRING, allowNull: true },
    lot_number: { type: DataTypes.STRING, allowNull: false },
    lot_expires_on: { type: DataTypes.DATEONLY, allowNull: false },
    powder_ok: { type: DataTypes.BOOLEAN, allowNull: false },
    diluent_ok: { type: DataTypes.BOOLEAN, allowNull: false },
    inspected_by_user_id: user(false),
    mixed_at: { type: DataTypes.DATE, allowNull: true },
    status: { type: DataTypes.STRING, allowNull: false, defaultValue: 'prepared' },
    waste_reason: { type: DataTypes.STRING, allowNull: true },
    waste_note: { type: DataTypes.TEXT, allowNull: true },
    wasted_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('visit_kits', ['visit_id'])
}

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('visit_kits')
  await qi.dropTable('visits')
}
