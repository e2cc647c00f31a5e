import { DataTypes } from 'sequelize'
import type { MigrationFn } from './types'

/*
 * Issue 12, the monitoring plan: one plan per patient, owned by a clinician and made from
 * the clinic defaults of a regimen, and its items (a kind of check, its interval, first-due
 * and last-done dates, whether it is active, a note).
 */
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('monitoring_plans', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    patient_id: { type: DataTypes.INTEGER, allowNull: false, unique: true, references: { model: 'patients', key: 'id' }, onDelete: 'CASCADE' },
    owner_user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' } },
    regimen_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'regimens', key: 'id' } },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.createTable('monitoring_items', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    plan_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'monitoring_plans', key: 'id' }, onDelete: 'CASCADE' },
    patient_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'patients', key: 'id' }, onDelete: 'CASCADE' },
    kind: { type: DataTypes.STRING, allowNull: false },
    interval_days: { type: DataTypes.INTEGER, allowNull: false },
    first_due_on: { type: DataTypes.DATEONLY, allowNull: false },
    last_done_on: { type: DataTypes.DATEONLY, allowNull: true },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    note: { type: DataTypes.TEXT, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('monitoring_items', ['plan_id', 'kind'], { unique: true })
  await qi.addIndex('monitoring_items', ['patient_id', 'kind'])
}

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('monitoring_items')
  await qi.dropTable('monitoring_plans')
}
