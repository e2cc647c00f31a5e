import type { QueryInterface } from 'sequelize'
import type { MigrationFn as UmzugMigrationFn } from 'umzug'

export type MigrationFn = UmzugMigrationFn<QueryInterface>
