import { DataTypes } from 'sequelize'
import type { ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { Attachment } from './attachment'
import type { MessageRead } from './message-read'
import type { MessageThread } from './message-thread'
import type { Patient } from './patient'
import type { User } from './user'
import { FormRecordModel, requestIdColumn } from './columns'

/**
 * One message in a thread. Part of the record: never deleted; staff may mark it entered in
 * error (who, when, why), which hides it from the patient's circle and keeps it for staff.
 */
export class Message extends FormRecordModel<InferAttributes<Message>, InferCreationAttributes<Message>> {
  declare threadId: ForeignKey<MessageThread['id']>
  declare patientId: ForeignKey<Patient['id']>
  declare thread?: NonAttribute<MessageThread>
  // Who wrote it, and what.
  declare authorUserId: ForeignKey<User['id']>
  declare author?: NonAttribute<User>
  declare body: string
  // Entered in error: by whom, when and why (kept; hidden from his circle).
  declare enteredInErrorAt: Date | null
  declare enteredInErrorByUserId: ForeignKey<User['id']> | null
  declare enteredInErrorBy?: NonAttribute<User | null>
  declare enteredInErrorReason: string | null
  // Its files, and who has read it.
  declare attachments?: NonAttribute<Attachment[]>
  declare reads?: NonAttribute<MessageRead[]>

  static initModel(sequelize: Sequelize) {
    Message.initRecord(sequelize, 'messages', {
      body: { type: DataTypes.TEXT, allowNull: false },
      enteredInErrorAt: { type: DataTypes.DATE, allowNull: true, field: 'entered_in_error_at' },
      enteredInErrorReason: { type: DataTypes.TEXT, allowNull: true, field: 'entered_in_error_reason' },
      ...requestIdColumn(),
    })
  }
}
