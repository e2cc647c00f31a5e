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
  await qi.addColumn('patients', 'phones', { type: DataTypes.JSON, allowNull: false, defaultValue: '[]' })
  await qi.addColumn('patients', 'best_times_to_call', { type: DataTypes.STRING(200), allowNull: false, defaultValue: '' })
  await qi.addColumn('patients', 'preferred_contact', { type: DataTypes.STRING, allowNull: false, defaultValue: 'phone' })
  await qi.addColumn('users', 'phone', { type: DataTypes.STRING, allowNull: true })
}

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.removeColumn('users', 'phone')
  await qi.removeColumn('patients', 'preferred_contact')
  await qi.removeColumn('patients', 'best_times_to_call')
  await qi.removeColumn('patients', 'phones')
  await qi.removeColumn('patients', 'risk_profile')
  await qi.removeIndex('diary_entries', 'diary_entries_patient_draft')
  await qi.removeColumn('diary_entries', 'complete')
  await qi.removeColumn('diary_entries', 'draft_id')
}
