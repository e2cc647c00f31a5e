import { DataTypes } from 'sequelize'
import type { CreationOptional, ForeignKey, InferAttributes, InferCreationAttributes, NonAttribute, Sequelize } from 'sequelize'
import type { MonitoringKind } from '#shared/monitoring/rules'
import type { Patient } from './patient'
import type { Regimen } from './regimen'
import type { User } from './user'
import { RecordModel } from './columns'

/** A patient's monitoring plan, owned by a clinician, made from the defaults of a regimen. */
export class MonitoringPlan extends RecordModel<InferAttributes<MonitoringPlan>, InferCreationAttributes<MonitoringPlan>> {
  declare patientId: ForeignKey<Patient['id']>
  declare ownerUserId: ForeignKey<User['id']>
  declare regimenId: ForeignKey<Regimen['id']> | null
  declare owner?: NonAttribute<User>
  declare regimen?: NonAttribute<Regimen>
  declare items?: NonAttribute<MonitoringItem[]>

  static initModel(sequelize: Sequelize) {
    MonitoringPlan.initRecord(sequelize, 'monitoring_plans', {
      regimenId: { type: DataTypes.INTEGER, allowNull: true, field: 'regimen_id' },
    })
  }
}

/** One check of the plan: its interval, first-due and last-done dates. */
export class MonitoringItem extends RecordModel<InferAttributes<MonitoringItem>, InferCreationAttributes<MonitoringItem>> {
  // Whose plan it is part of (the patient is kept on the item too, so every read is scoped).
  declare planId: ForeignKey<MonitoringPlan['id']>
  declare patientId: ForeignKey<Patient['id']>
  declare plan?: NonAttribute<MonitoringPlan>
  declare patient?: NonAttribute<Patient>
  // The check: which, how often, from when, when last done; off for men it is not for.
  declare kind: MonitoringKind
  declare intervalDays: number
  declare firstDueOn: string
  declare lastDoneOn: string | null
  declare active: CreationOptional<boolean>
  declare note: string | null

  static initModel(sequelize: Sequelize) {
    MonitoringItem.initRecord(sequelize, 'monitoring_items', {
      kind: { type: DataTypes.STRING, allowNull: false },
      intervalDays: { type: DataTypes.INTEGER, allowNull: false, field: 'interval_days' },
      firstDueOn: { type: DataTypes.DATEONLY, allowNull: false, field: 'first_due_on' },
      lastDoneOn: { type: DataTypes.DATEONLY, allowNull: true, field: 'last_done_on' },
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      note: { type: DataTypes.TEXT, allowNull: true },
    })
  }
}
