import { DataTypes } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'
import { RecordModel, statusColumn } from './columns'

export interface OutboxAttachment {
  filename: string
  contentType: string
  content: string
}

/** An e-mail waiting to be sent, written in the same transaction as the change that caused it. */
export class OutboxMessage extends RecordModel<InferAttributes<OutboxMessage>, InferCreationAttributes<OutboxMessage>> {
  declare to: string
  declare subject: string
  declare text: string
  declare html: string
  declare attachments: CreationOptional<OutboxAttachment[]>
  declare dedupeKey: string | null
  declare status: CreationOptional<'pending' | 'sent'>
  declare attempts: CreationOptional<number>
  declare nextAttemptAt: CreationOptional<Date>
  declare lastError: string | null
  declare sentAt: Date | null

  static initModel(sequelize: Sequelize) {
    OutboxMessage.initRecord(sequelize, 'outbox_messages', {
      to: { type: DataTypes.STRING, allowNull: false, field: 'to_address' },
      subject: { type: DataTypes.STRING, allowNull: false },
      text: { type: DataTypes.TEXT, allowNull: false },
      html: { type: DataTypes.TEXT, allowNull: false },
      attachments: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
      dedupeKey: { type: DataTypes.STRING, allowNull: true, unique: true, field: 'dedupe_key' },
      ...statusColumn('pending'),
      attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      nextAttemptAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW, field: 'next_attempt_at' },
      lastError: { type: DataTypes.TEXT, allowNull: true, field: 'last_error' },
      sentAt: { type: DataTypes.DATE, allowNull: true, field: 'sent_at' },
    })
  }
}
