import { DataTypes } from 'sequelize'
import type { MigrationFn } from './types'

/*
 * Issue 13, messages and attachments: one conversation space per patient with the care team,
 * threads with a subject, messages that are never deleted (staff mark one "entered in error",
 * kept), read receipts, and the files sent with them (kept in the object store under
 * object_key; a row here is the only way to reach one). Caregivers get a new permission,
 * can_message, on the grant and on the invitation.
 */
export const up: MigrationFn = async ({ context: qi }) => {
  const id = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true }
  const patient = { type: DataTypes.INTEGER, allowNull: false, references: { model: 'patients', key: 'id' }, onDelete: 'CASCADE' }
  const user = (allowNull: boolean) => ({ type: DataTypes.INTEGER, allowNull, references: { model: 'users', key: 'id' } })
  const timestamps = { created_at: { type: DataTypes.DATE, allowNull: false }, updated_at: { type: DataTypes.DATE, allowNull: false } }

  await qi.addColumn('care_grants', 'can_message', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false })
  await qi.addColumn('circle_invitations', 'can_message', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false })

  await qi.createTable('message_threads', {
    id,
    patient_id: patient,
    subject: { type: DataTypes.STRING, allowNull: false },
    started_by_user_id: user(false),
    last_message_at: { type: DataTypes.DATE, allowNull: false },
    ...timestamps,
  })
  await qi.addIndex('message_threads', ['patient_id', 'last_message_at'])

  await qi.createTable('messages', {
    id,
    thread_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'message_threads', key: 'id' }, onDelete: 'CASCADE' },
    patient_id: patient,
    author_user_id: user(false),
    body: { type: DataTypes.TEXT, allowNull: false },
    entered_in_error_at: { type: DataTypes.DATE, allowNull: true },
    entered_in_error_by_user_id: user(true),
    entered_in_error_reason: { type: DataTypes.TEXT, allowNull: true },
    request_id: { type: DataTypes.STRING, allowNull: true },
    ...timestamps,
  })
  await qi.addIndex('messages', ['thread_id', 'created_at'])
  await qi.addIndex('messages', ['patient_id', 'request_id'], { unique: true, name: 'messages_patient_request' })

  await qi.createTable('message_reads', {
    id,
    message_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'messages', key: 'id' }, onDelete: 'CASCADE' },
    user_id: user(false),
    read_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('message_reads', ['message_id', 'user_id'], { unique: true, name: 'message_reads_once' })
  await qi.addIndex('message_reads', ['user_id'])

  await qi.createTable('attachments', {
    id,
    patient_id: patient,
    message_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'messages', key: 'id' } },
    object_key: { type: DataTypes.STRING, allowNull: false, unique: true },
    kind: { type: DataTypes.STRING, allowNull: false },
    mime: { type: DataTypes.STRING, allowNull: false },
    byte_size: { type: DataTypes.INTEGER, allowNull: false },
    file_name: { type: DataTypes.STRING, allowNull: false },
    width: { type: DataTypes.INTEGER, allowNull: true },
    height: { type: DataTypes.INTEGER, allowNull: true },
    pages: { type: DataTypes.INTEGER, allowNull: true },
    uploaded_by_user_id: user(false),
    lab_result_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'lab_results', key: 'id' } },
    ...timestamps,
  })
  await qi.addIndex('attachments', ['patient_id', 'message_id'])
  await qi.addIndex('attachments', ['lab_result_id'])
}

/* SQLite's own DROP COLUMN (3.35+), as in 0007: removeColumn would rebuild the tables. */
export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('attachments')
  await qi.dropTable('message_reads')
  await qi.dropTable('messages')
  await qi.dropTable('message_threads')
  await qi.sequelize.query('ALTER TABLE "circle_invitations" DROP COLUMN "can_message"')
  await qi.sequelize.query('ALTER TABLE "care_grants" DROP COLUMN "can_message"')
}
