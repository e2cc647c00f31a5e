import { DataTypes, Model } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { TriageLevel, TriageReason } from '#shared/triage/rules'
import type { DiaryEntryInput } from '#shared/diary/schemas'
import type { Patient } from './patient'
import type { User } from './user'
import type { TriageItem } from './triage-item'
import { idColumn } from './columns'

/** One weekly diary entry with the triage the server worked out when it arrived. */
export class DiaryEntry extends Model<InferAttributes<DiaryEntry>, InferCreationAttributes<DiaryEntry>> {
  declare id: CreationOptional<number>
  declare patientId: ForeignKey<Patient['id']>
  declare enteredByUserId: ForeignKey<User['id']>
  declare answers: DiaryEntryInput
  declare level: TriageLevel
  declare reasons: TriageReason[]
  declare respondBy: Date | null
  declare noteFlagged: boolean
  declare flareWatchActive: boolean
  declare rulesVersion: string
  declare hotFlushScore: number
  declare worstPain: number
  declare submittedAt: Date
  /** The id the diary page gave its draft: joins a right-now report and the rest of the diary. */
  declare draftId: string | null
  /** False while only a right-now report has arrived; the rest of the diary completes it. */
  declare complete: CreationOptional<boolean>
  declare enteredBy?: NonAttribute<User>
  declare triageItem?: NonAttribute<TriageItem | null>

  static initModel(sequelize: Sequelize) {
    DiaryEntry.init({
      ...idColumn(),
      answers: { type: DataTypes.JSON, allowNull: false },
      level: { type: DataTypes.STRING, allowNull: false },
      reasons: { type: DataTypes.JSON, allowNull: false },
      respondBy: { type: DataTypes.DATE, allowNull: true, field: 'respond_by' },
      noteFlagged: { type: DataTypes.BOOLEAN, allowNull: false, field: 'note_flagged' },
      flareWatchActive: { type: DataTypes.BOOLEAN, allowNull: false, field: 'flare_watch_active' },
      rulesVersion: { type: DataTypes.STRING, allowNull: false, field: 'rules_version' },
      hotFlushScore: { type: DataTypes.INTEGER, allowNull: false, field: 'hot_flush_score' },
      worstPain: { type: DataTypes.INTEGER, allowNull: false, field: 'worst_pain' },
      submittedAt: { type: DataTypes.DATE, allowNull: false, field: 'submitted_at' },
      draftId: { type: DataTypes.STRING, allowNull: true, field: 'draft_id' },
      complete: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    }, {
      sequelize,
      tableName: 'diary_entries',
      timestamps: false,
      indexes: [{ name: 'diary_entries_patient_draft', unique: true, fields: ['patient_id', 'draft_id'] }],
    })
  }
}
