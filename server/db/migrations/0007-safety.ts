import { DataTypes } from 'sequelize'
import type { MigrationFn } from './types'

/*
 * Issue 9: a diary entry can be opened by a right-now "yes" sent on its own and completed
 * later under the page's draft id (unique per patient, so the same report twice stores one
 * entry); the patient record gains his risk profile, phones and contact preferences, and
 * every user a phone (a caregiver's own number).
 */
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.addColumn('diary_entries', 'draft_id', { type: DataTypes.STRING, allowNull: true })
  await qi.addColumn('diary_entries', 'complete', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true })
  await qi.addIndex('diary_entries', ['patient_id', 'draft_id'], { unique: true, name: 'diary_entries_patient_draft' })
  await qi.addColumn('patients', 'risk_profile', { type: DataTypes.JSON, allowNull: true })
  await qi.addColumn('patients', 'phones', { type: DataTypes.JSON, allowNull: false, defaultValue: [] })
  await qi.addColumn('patients', 'best_times_to_call', { type: DataTypes.STRING(200), allowNull: false, defaultValue: '' })
  await qi.addColumn('patients', 'preferred_contact', { type: DataTypes.STRING, allowNull: false, defaultValue: 'phone' })
  await qi.addColumn('users', 'phone', { type: DataTypes.STRING, allowNull: true })
}

/*
 * SQLite's own DROP COLUMN (3.35+): Sequelize's removeColumn rebuilds the table instead,
 * and dropping the old patients table would cascade to every row that refers to it.
 */
export const down: MigrationFn = async ({ context: qi }) => {
  await qi.removeIndex('diary_entries', 'diary_entries_patient_draft')
  const drops: [table: string, column: string][] = [
    ['users', 'phone'],
    ['patients', 'preferred_contact'],
    ['patients', 'best_times_to_call'],
    ['patients', 'phones'],
    ['patients', 'risk_profile'],
    ['diary_entries', 'complete'],
    ['diary_entries', 'draft_id'],
  ]
  for (const [table, column] of drops) await qi.sequelize.query(`ALTER TABLE "${table}" DROP COLUMN "${column}"`)
}
