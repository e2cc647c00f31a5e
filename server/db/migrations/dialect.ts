import type { QueryInterface } from 'sequelize'

/*
 * The few places where the migrations written for SQLite need another word on PostgreSQL
 * (NUXT_DATABASE_URL; see server/utils/core/db.ts). SQLite gets exactly what it always got.
 */

/**
 * A JSON column's default. SQLite keeps JSON as text, so the old migrations give the text
 * ('[]'); on PostgreSQL that text would be stored as a JSON string ("[]"), not an array.
 */
export function jsonDefault(qi: QueryInterface, text: string): unknown {
  return qi.sequelize.getDialect() === 'postgres' ? JSON.parse(text) : text
}
