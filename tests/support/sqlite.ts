import pg from 'pg'
import sqlite3 from 'sqlite3'

/** A test server's database: its SQLite file, or (TIDEWELL_DB=postgres) its PostgreSQL database. */
export type Database = string | { dbPath: string, databaseUrl?: string }

/*
 * Rows read the same from both databases, as SQLite gives them: booleans as 1 and 0,
 * instants as the text Sequelize stores ('2026-03-08 04:30:00.000 +00:00'), JSON as its
 * text, counts as numbers.
 */
pg.types.setTypeParser(pg.types.builtins.INT8 ?? 20, (value: string) => Number.parseInt(value, 10))
pg.types.setTypeParser(pg.types.builtins.DATE ?? 1082, (value: string) => value)
const storedInstant = (at: Date) => `${at.toISOString().replace('T', ' ').replace('Z', '')} +00:00`
const JSON_TYPES = new Set([114, 3802])
const asSqlite = (value: unknown, json: boolean): unknown => {
  if (value === null) return value
  if (json) return JSON.stringify(value)
  if (typeof value === 'boolean') return value ? 1 : 0
  if (value instanceof Date) return storedInstant(value)
  return value
}

/** `?` placeholders as PostgreSQL's $1, $2… (none sits inside a quoted literal in the tests). */
const numbered = (statement: string) => {
  let n = 0
  return statement.replace(/'(?:[^']|'')*'|\?/g, part => (part === '?' ? `$${++n}` : part))
}

async function onPostgres<T>(url: string, statement: string, params: unknown[], exec: boolean): Promise<T[]> {
  const client = new pg.Client({ connectionString: url })
  await client.connect()
  try {
    if (exec) {
      await client.query(statement)
      return []
    }
    const { rows, fields } = await client.query(numbered(statement), params)
    const json = new Set(fields.filter(field => JSON_TYPES.has(field.dataTypeID)).map(field => field.name))
    return rows.map(row => Object.fromEntries(Object.entries(row).map(([key, value]) => [key, asSqlite(value, json.has(key))]))) as T[]
  }
  finally {
    await client.end()
  }
}

/**
 * Runs SQL against a test server's database (for counting rows or sabotaging a write):
 * given the app (or its file), on whichever database it uses. Write the SQL both accept
 * (quote camelCase aliases: AS "patientId").
 */
export async function sql<T = Record<string, unknown>>(database: Database, statement: string, params: unknown[] = [], options: { exec?: boolean } = {}): Promise<T[]> {
  const target = typeof database === 'string' ? { dbPath: database } : database
  if (target.databaseUrl) return onPostgres<T>(target.databaseUrl, statement, params, !!options.exec)
  const db = new sqlite3.Database(target.dbPath)
  try {
    await new Promise<void>((done, fail) => db.run('PRAGMA busy_timeout = 5000', err => (err ? fail(err) : done())))
    // exec: several statements separated by semicolons, no parameters, no rows back.
    if (options.exec) return await new Promise<T[]>((done, fail) => db.exec(statement, err => (err ? fail(err) : done([]))))
    return await new Promise<T[]>((done, fail) => db.all(statement, params, (err, rows) => (err ? fail(err) : done(rows as T[]))))
  }
  finally {
    await new Promise<void>(done => db.close(() => done()))
  }
}

/**
 * Makes every INSERT into `table` fail (a trigger), to see a write that cannot complete roll
 * back whole; returns the undo. The trigger's words differ between the two databases.
 */
export async function refuseInserts(database: Database, table: string): Promise<() => Promise<void>> {
  const trigger = `refuse_${table}`
  const postgres = typeof database !== 'string' && !!database.databaseUrl
  if (postgres) {
    await sql(database, `CREATE OR REPLACE FUNCTION refuse_by_test() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RAISE EXCEPTION 'refused by test'; END $$;
      CREATE TRIGGER ${trigger} BEFORE INSERT ON ${table} FOR EACH ROW EXECUTE FUNCTION refuse_by_test()`, [], { exec: true })
    return async () => {
      await sql(database, `DROP TRIGGER ${trigger} ON ${table}`)
    }
  }
  await sql(database, `CREATE TRIGGER ${trigger} BEFORE INSERT ON ${table} BEGIN SELECT RAISE(ABORT, 'refused by test'); END`)
  return async () => {
    await sql(database, `DROP TRIGGER ${trigger}`)
  }
}
