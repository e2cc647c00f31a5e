import { DataTypes } from 'sequelize'
import type { MigrationFn } from './types'

export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('diary_entries', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    patient_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'patients', key: 'id' }, onDelete: 'CASCADE' },
    entered_by_user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' } },
    answers: { type: DataTypes.JSON, allowNull: false },
    level: { type: DataTypes.STRING, allowNull: false },
    reasons: { type: DataTypes.JSON, allowNull: false },
    respond_by: { type: DataTypes.DATE, allowNull: true },
    note_flagged: { type: DataTypes.BOOLEAN, allowNull: false },
    flare_watch_active: { type: DataTypes.BOOLEAN, allowNull: false },
    rules_version: { type: DataTypes.STRING, allowNull: false },
    hot_flush_score: { type: DataTypes.INTEGER, allowNull: false },
    worst_pain: { type: DataTypes.INTEGER, allowNull: false },
    submitted_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('diary_entries', ['patient_id', 'submitted_at'])
}

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('diary_entries')
}
