import { DataTypes } from 'sequelize'
import type { MigrationFn } from './types'

export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('lab_results', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    patient_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'patients', key: 'id' }, onDelete: 'CASCADE' },
    kind: { type: DataTypes.STRING, allowNull: false },
    taken_on: { type: DataTypes.DATEONLY, allowNull: false },
    value: { type: DataTypes.DOUBLE, allowNull: false },
    unit: { type: DataTypes.STRING, allowNull: false },
    heart_rate: { type: DataTypes.DOUBLE, allowNull: true },
    note: { type: DataTypes.TEXT, allowNull: true },
    entered_by_user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' } },
    created_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('lab_results', ['patient_id', 'kind', 'taken_on'])
}

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('lab_results')
}
