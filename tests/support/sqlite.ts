import sqlite3 from 'sqlite3'

/** Runs SQL against a test server's database file (for counting rows or sabotaging a write). */
export async function sql<T = Record<string, unknown>>(dbPath: string, statement: string, params: unknown[] = [], options: { exec?: boolean } = {}): Promise<T[]> {
  const db = new sqlite3.Database(dbPath)
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
