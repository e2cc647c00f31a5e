import { DataTypes } from 'sequelize'
import type { MigrationFn } from './types'

/*
 * Issue 14: PostgreSQL holds a VARCHAR(255) to its length, SQLite never did. The columns
 * whose values come from outside and may be longer become TEXT there: the request line of an
 * audit event (a path with its query string), the address it came from, and an e-mail's
 * dedupe key (built from an address of up to 254 characters). Too long a value would fail
 * the write, and with it the read it audits. SQLite is left as it is (its TEXT affinity
 * already keeps any length).
 */
const COLUMNS = [
  ['audit_events', 'resource', false],
  ['audit_events', 'ip', true],
  ['outbox_messages', 'dedupe_key', true],
] as const

export const up: MigrationFn = async ({ context: qi }) => {
  if (qi.sequelize.getDialect() !== 'postgres') return
  for (const [table, column, allowNull] of COLUMNS) {
    await qi.changeColumn(table, column, { type: DataTypes.TEXT, allowNull })
  }
}

export const down: MigrationFn = async ({ context: qi }) => {
  if (qi.sequelize.getDialect() !== 'postgres') return
  for (const [table, column, allowNull] of COLUMNS) {
    await qi.changeColumn(table, column, { type: DataTypes.STRING, allowNull })
  }
}
