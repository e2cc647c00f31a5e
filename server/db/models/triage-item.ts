import { DataTypes } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { TriageLevel, TriageReason } from '#shared/triage/rules'
import type { Disposition, TriageItemStatus, TriageSource } from '#shared/triage/schemas'
import type { DiaryEntry } from './diary-entry'
import type { Patient } from './patient'
import type { User } from './user'
import { RecordModel, statusColumn } from './columns'

/** One piece of work in the nurses' triage queue. */
export class TriageItem extends RecordModel<InferAttributes<TriageItem>, InferCreationAttributes<TriageItem>> {
  declare patientId: ForeignKey<Patient['id']>
  declare source: TriageSource
  /** Unique per source occurrence (diary:<id>, overdue:<patient>:<due date>): never twice. */
  declare sourceKey: string
  declare diaryEntryId: ForeignKey<DiaryEntry['id']> | null
  declare level: TriageLevel
  declare reasons: TriageReason[]
  declare respondBy: Date | null
  declare status: CreationOptional<TriageItemStatus>
  declare assigneeUserId: ForeignKey<User['id']> | null
  declare disposition: Disposition | null
  declare escalatedAt: Date | null
  declare closedAt: Date | null
  declare patient?: NonAttribute<Patient>
  declare assignee?: NonAttribute<User | null>

  static initModel(sequelize: Sequelize) {
    TriageItem.initRecord(sequelize, 'triage_items', {
      source: { type: DataTypes.STRING, allowNull: false },
      sourceKey: { type: DataTypes.STRING, allowNull: false, unique: true, field: 'source_key' },
      level: { type: DataTypes.STRING, allowNull: false },
      reasons: { type: DataTypes.JSON, allowNull: false },
      respondBy: { type: DataTypes.DATE, allowNull: true, field: 'respond_by' },
      ...statusColumn('new'),
      disposition: { type: DataTypes.STRING, allowNull: true },
      escalatedAt: { type: DataTypes.DATE, allowNull: true, field: 'escalated_at' },
      closedAt: { type: DataTypes.DATE, allowNull: true, field: 'closed_at' },
    })
  }
}
