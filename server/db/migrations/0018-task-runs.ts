import { DataTypes } from 'sequelize'
import type { MigrationFn } from './types'

/*
 * Issue 14, several app instances on one database: each run of a scheduled task is a row,
 * claimed by the instance that inserts it first (unique per task and schedule slot), so a
 * schedule's tick runs once across instances. The holder renews its lease while it runs; a
 * run whose lease has passed was interrupted (its instance died) and is taken over by
 * whoever is alive (server/utils/core/task-runs.ts).
 */
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.createTable('task_runs', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    name: { type: DataTypes.STRING, allowNull: false },
    // The schedule's tick (its minute, ISO) or, for a run asked for by hand, a fresh key.
    slot: { type: DataTypes.STRING, allowNull: false },
    // The instant the task runs as of (the tick, or the `now` a test gives).
    run_as_of: { type: DataTypes.DATE, allowNull: false },
    status: { type: DataTypes.STRING, allowNull: false, defaultValue: 'running' },
    holder: { type: DataTypes.STRING, allowNull: false },
    lease_until: { type: DataTypes.DATE, allowNull: false },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    finished_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  })
  await qi.addIndex('task_runs', ['name', 'slot'], { unique: true, name: 'task_runs_name_slot' })
  await qi.addIndex('task_runs', ['status', 'lease_until'], { name: 'task_runs_status_lease' })
}

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.dropTable('task_runs')
}
