import { DataTypes } from 'sequelize'
import { jsonDefault } from './dialect'
import type { MigrationFn } from './types'

export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('triage_items', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    patient_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'patients', key: 'id' }, onDelete: 'CASCADE' },
    source: { type: DataTypes.STRING, allowNull: false },
    source_key: { type: DataTypes.STRING, allowNull: false, unique: true },
    diary_entry_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'diary_entries', key: 'id' }, onDelete: 'CASCADE' },
    level: { type: DataTypes.STRING, allowNull: false },
    reasons: { type: DataTypes.JSON, allowNull: false },
    respond_by: { type: DataTypes.DATE, allowNull: true },
    status: { type: DataTypes.STRING, allowNull: false, defaultValue: 'new' },
    assignee_user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' } },
    disposition: { type: DataTypes.STRING, allowNull: true },
    escalated_at: { type: DataTypes.DATE, allowNull: true },
    closed_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('triage_items', ['status', 'respond_by'])
  await qi.addIndex('triage_items', ['patient_id', 'status'])
  await qi.addIndex('triage_items', ['diary_entry_id'])
  await qi.createTable('triage_events', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    item_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'triage_items', key: 'id' }, onDelete: 'CASCADE' },
    actor_user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' } },
    type: { type: DataTypes.STRING, allowNull: false },
    note: { type: DataTypes.TEXT, allowNull: true },
    data: { type: DataTypes.JSON, allowNull: false, defaultValue: jsonDefault(qi, '{}') },
    at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('triage_events', ['item_id', 'at'])
}

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('triage_events')
  await qi.dropTable('triage_items')
}
