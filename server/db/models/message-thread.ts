import { DataTypes } from 'sequelize'
import type { ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { Message } from './message'
import type { Patient } from './patient'
import type { User } from './user'
import { RecordModel } from './columns'

/** One conversation about one patient between his circle and the care team, with a subject. */
export class MessageThread extends RecordModel<InferAttributes<MessageThread>, InferCreationAttributes<MessageThread>> {
  declare patientId: ForeignKey<Patient['id']>
  declare subject: string
  // Who started it (the patient's circle or staff), and when the last message came.
  declare startedByUserId: ForeignKey<User['id']>
  declare lastMessageAt: Date
  declare messages?: NonAttribute<Message[]>
  declare startedBy?: NonAttribute<User>

  static initModel(sequelize: Sequelize) {
    MessageThread.initRecord(sequelize, 'message_threads', {
      subject: { type: DataTypes.STRING, allowNull: false },
      lastMessageAt: { type: DataTypes.DATE, allowNull: false, field: 'last_message_at' },
    })
  }
}
