import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { Message } from './message'
import type { User } from './user'
import { idColumn } from './columns'

/** One person has read one message (at most once): unread counts and read receipts. */
export class MessageRead extends Model<InferAttributes<MessageRead>, InferCreationAttributes<MessageRead>> {
  declare id: CreationOptional<number>
  declare messageId: ForeignKey<Message['id']>
  declare userId: ForeignKey<User['id']>
  declare readAt: Date
  declare user?: NonAttribute<User>

  static initModel(sequelize: Sequelize) {
    MessageRead.init({
      ...idColumn(),
      readAt: { type: DataTypes.DATE, allowNull: false, field: 'read_at' },
    }, { sequelize, tableName: 'message_reads', timestamps: false })
  }
}
