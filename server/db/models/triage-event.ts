import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { TriageEventType } from '#shared/triage/schemas'
import type { TriageItem } from './triage-item'
import type { User } from './user'
import { idColumn } from './columns'

/** One line of a triage item's timeline. actorUserId is null for the system. */
export class TriageEvent extends Model<InferAttributes<TriageEvent>, InferCreationAttributes<TriageEvent>> {
  declare id: CreationOptional<number>
  declare itemId: ForeignKey<TriageItem['id']>
  declare actorUserId: ForeignKey<User['id']> | null
  declare type: TriageEventType
  declare note: string | null
  declare data: CreationOptional<Record<string, unknown>>
  declare at: Date
  declare actor?: NonAttribute<User | null>

  static initModel(sequelize: Sequelize) {
    TriageEvent.init({
      ...idColumn(),
      type: { type: DataTypes.STRING, allowNull: false },
      note: { type: DataTypes.TEXT, allowNull: true },
      data: { type: DataTypes.JSON, allowNull: false, defaultValue: {} },
      at: { type: DataTypes.DATE, allowNull: false },
    }, { sequelize, tableName: 'triage_events', timestamps: false })
  }
}
