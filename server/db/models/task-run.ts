import { DataTypes } from 'sequelize'
import type { CreationOptional, InferAttributes, InferCreationAttributes, Sequelize } from 'sequelize'
import { RecordModel, statusColumn } from './columns'

/** One run of a scheduled task, claimed by one instance (migration 0018; server/utils/core/task-runs.ts). */
export class TaskRun extends RecordModel<InferAttributes<TaskRun>, InferCreationAttributes<TaskRun>> {
  declare name: string
  declare slot: string
  declare runAsOf: Date
  declare status: CreationOptional<'running' | 'done' | 'failed'>
  declare holder: string
  declare leaseUntil: Date
  declare attempts: CreationOptional<number>
  declare finishedAt: CreationOptional<Date | null>

  static initModel(sequelize: Sequelize) {
    TaskRun.initRecord(sequelize, 'task_runs', {
      name: { type: DataTypes.STRING, allowNull: false },
      slot: { type: DataTypes.STRING, allowNull: false },
      runAsOf: { type: DataTypes.DATE, allowNull: false, field: 'run_as_of' },
      ...statusColumn('running'),
      holder: { type: DataTypes.STRING, allowNull: false },
      leaseUntil: { type: DataTypes.DATE, allowNull: false, field: 'lease_until' },
      attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      finishedAt: { type: DataTypes.DATE, allowNull: true, field: 'finished_at' },
    })
  }
}
