// The app tsconfig reaches this file through the tests but does not include server/types.
// eslint-disable-next-line @typescript-eslint/triple-slash-reference
/// <reference path="../../types/pg.d.ts" />
import { AsyncLocalStorage } from 'node:async_hooks'
import { mkdirSync } from 'node:fs'
import { dirname, resolve } from 'node:path'
import pg from 'pg'
import type { Client as PgClient } from 'pg'
import { Op, QueryTypes, Sequelize, Transaction } from 'sequelize'
import type { TransactionOptions } from 'sequelize'
import sqlite3 from 'sqlite3'
import { SequelizeStorage, Umzug } from 'umzug'
import { migrations } from '../../db/migrations'
import { initModels } from '../../db/models'
import type { WriteQueue } from './write-queue'
import { createWriteQueue, writeQueueBusy } from './write-queue'
import { seedDemoActivity } from '../../db/seed/activity'
import { seedDemoClinic } from '../../db/seed/demo'

let ready: Promise<Sequelize> | undefined
let seeded: Promise<Sequelize> | undefined

/** Applies every pending migration; returns the names it applied. */
export async function migrate(sequelize: Sequelize) {
  const umzug = new Umzug({
    migrations,
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  })
  const applied = await umzug.up()
  return applied.map(m => m.name)
}

type Connection = sqlite3.Database & { tidewellConfigured?: boolean }

/*
 * Sequelize's SQLite dialect asks `PRAGMA table_info(<table>)` before every SELECT (to know
 * which columns hold dates and booleans), one more trip through libuv's thread pool each
 * time; inside a write transaction every trip also waits for the event loop while the
 * write line waits behind it. The schema does not change once the migrations have run, so
 * each table's answer is kept from the first time (cleared when migrations run).
 */
const TABLE_INFO = /^PRAGMA table_info\(`?([\w]+)`?\)$/
const tableInfo = new Map<string, unknown[]>()
let schemaSettled = false

function keepTableInfo(connection: Connection) {
  const all = connection.all.bind(connection) as (sql: string, ...rest: unknown[]) => Connection
  connection.all = ((sql: string, ...rest: unknown[]) => {
    const table = schemaSettled && typeof sql === 'string' ? TABLE_INFO.exec(sql)?.[1] : undefined
    const callback = rest.at(-1)
    if (!table || rest.length !== 1 || typeof callback !== 'function') return all(sql, ...rest)
    const kept = tableInfo.get(table)
    if (kept) {
      process.nextTick(callback as (error: null, rows: unknown[]) => void, null, kept)
      return connection
    }
    return all(sql, (error: Error | null, rows: unknown[]) => {
      if (!error && schemaSettled) tableInfo.set(table, rows)
      ;(callback as (error: Error | null, rows: unknown[]) => void)(error, rows)
    })
  }) as Connection['all']
}

/**
 * Sequelize opens one SQLite connection per transaction (and closes it after), turning
 * foreign keys on for each, but has no hook for other per-connection settings on this
 * dialect: wrap getConnection to give every connection a busy timeout. Since transactions
 * of this process run one at a time (queueWrites), those that take their turn in the
 * write line share one writer connection, kept open: a new connection would open the
 * file and read the schema again for every transaction. A connection Sequelize gives up
 * on (a failed COMMIT or ROLLBACK leaves it in an unknown state) is closed and the next
 * transaction opens a fresh one.
 */
function configureEachConnection(sequelize: Sequelize) {
  const manager = sequelize.connectionManager as unknown as {
    getConnection: (options?: { uuid?: string }) => Promise<Connection>
    releaseConnection: (connection: Connection, force?: boolean) => unknown
    destroyConnection: (connection: Connection) => Promise<unknown>
    connections: Record<string, Connection>
  }
  const open = manager.getConnection.bind(manager)
  const release = manager.releaseConnection.bind(manager)
  const destroy = manager.destroyConnection.bind(manager)
  let writer: Connection | undefined
  // synchronous = NORMAL: in WAL mode a commit no longer waits for fsync (the WAL is synced
  // at checkpoints); a commit survives a crash of the process (kill -9), and only a power
  // cut or an OS crash may lose the last commits (see "The write path" in DEVELOPERS.md).
  const configured = async (connection: Connection) => {
    if (!connection.tidewellConfigured) {
      connection.configure('busyTimeout', 5000)
      keepTableInfo(connection)
      await new Promise<void>((done, fail) => connection.run('PRAGMA synchronous = NORMAL', error => (error ? fail(error) : done())))
      connection.tidewellConfigured = true
    }
    return connection
  }
  manager.getConnection = async (options) => {
    if (options?.uuid && options.uuid !== 'default' && turns.getStore()?.writer) {
      writer ??= await configured(await open({ ...options, uuid: WRITER }))
      return writer
    }
    return configured(await open(options))
  }
  manager.releaseConnection = (connection, force) => (connection === writer ? undefined : release(connection, force))
  manager.destroyConnection = async (connection) => {
    if (connection !== writer) return destroy(connection)
    writer = undefined
    Reflect.deleteProperty(manager.connections, WRITER)
    await new Promise(done => connection.close(() => done(undefined)))
  }
}

/** The key of the shared writer connection in Sequelize's connection map. */
const WRITER = 'tidewell-writer'

/*
 * SQLite has one writer at a time, and every transaction here takes the write lock at
 * BEGIN. Left to SQLite, a writer that finds the lock taken waits in the busy handler on
 * one of libuv's four pool threads; four such waiters take every thread, and the
 * transaction that holds the lock cannot run its next statement until they time out
 * (measured: see "The write path" in DEVELOPERS.md). So every write of this process waits
 * its turn in JavaScript instead, in one bounded line with a deadline (write-queue.ts):
 *
 * - a managed transaction (sequelize.transaction(callback)) runs when its turn comes; one
 *   started inside another's callback becomes a savepoint of it, on its connection;
 * - a statement made while a transaction's callback runs, without a transaction of its
 *   own, runs inside that transaction (an audit line, a settings read), never beside it;
 * - a write outside any transaction (Model.create, update, destroy, a raw INSERT) waits
 *   its turn in the same line and runs alone, ahead of the waiting transactions (it is
 *   one statement; a nurse's read that writes an audit line should not wait for fifty);
 * - the transactions that take their turn share one writer connection, kept open;
 * - reads outside a transaction do not wait: in WAL mode they run beside the writer.
 *
 * A full line or a passed deadline rejects with a 503 (errors.busy) before anything is
 * written; server/plugins/04.write-busy.ts adds the Retry-After header.
 */
interface Turn {
  /** The transaction whose callback is running, or null for a lone write. */
  transaction: Transaction | null
  /** Whether the job still holds the line (false once it has finished). */
  holding: boolean
  /** A transaction taking its turn: it runs on the shared writer connection. */
  writer?: boolean
}

const WRITE_STATEMENT = /^\s*(INSERT|UPDATE|DELETE|REPLACE|CREATE|DROP|ALTER|VACUUM|REINDEX|PRAGMA\s+\w+\s*=)/i

export function isWriteStatement(sql: unknown): boolean {
  const text = typeof sql === 'string' ? sql : (sql as { query?: unknown } | null)?.query
  return typeof text === 'string' && WRITE_STATEMENT.test(text)
}

const turns = new AsyncLocalStorage<Turn>()

/** Committed or rolled back (Sequelize sets `finished`; its types do not declare it). */
const isFinished = (transaction: Transaction) => (transaction as Transaction & { finished?: string }).finished !== undefined
let writeQueue: WriteQueue | undefined

/** The line this process's writes wait in (undefined before the first connection). */
export function useWriteQueue(): WriteQueue | undefined {
  return writeQueue
}

type Begin = (...args: unknown[]) => Promise<unknown>
type Query = (sql: unknown, options?: Record<string, unknown>) => Promise<unknown>
type Callback = (transaction: Transaction) => Promise<unknown>

/** The transaction of the turn this code runs in, while it is still open. */
function openTransaction(): Transaction | undefined {
  const turn = turns.getStore()
  return turn?.holding && turn.transaction && !isFinished(turn.transaction) ? turn.transaction : undefined
}

/**
 * Puts one dialect's writer design around sequelize.transaction and sequelize.query. What
 * both share: an unmanaged transaction (no callback; not used here, it would bypass the
 * design) passes through, and inside a managed transaction's callback a transaction started
 * becomes a savepoint on it and a statement without its own `transaction` runs in it. The
 * design decides how a new transaction and a statement outside one run.
 */
function wrapWrites(sequelize: Sequelize, design: {
  transaction: (options: Record<string | symbol, unknown>, callback: Callback, begin: Begin, query: Query) => Promise<unknown>
  statement: (sql: unknown, options: Record<string, unknown> | undefined, query: Query) => Promise<unknown>
}) {
  const begin = sequelize.transaction.bind(sequelize) as Begin
  const query = sequelize.query.bind(sequelize) as Query
  sequelize.transaction = ((...args: unknown[]) => {
    const callback = args.find(arg => typeof arg === 'function') as Callback | undefined
    if (!callback) return begin(...args)
    const options = ((args.length > 1 ? args[0] : undefined) ?? {}) as Record<string | symbol, unknown> & { transaction?: Transaction | null }
    const open = openTransaction()
    if (open) return begin({ ...options, transaction: options.transaction ?? open }, callback)
    return design.transaction(options, callback, begin, query)
  }) as Sequelize['transaction']
  sequelize.query = ((sql: unknown, options?: Record<string, unknown>) => {
    const open = openTransaction()
    if (open && options?.transaction === undefined) return query(sql, { ...options, transaction: open })
    return design.statement(sql, options, query)
  }) as Sequelize['query']
}

function queueWrites(sequelize: Sequelize, queue: WriteQueue) {
  wrapWrites(sequelize, {
    transaction: (options, callback, begin) => queue.run(async () => {
      const mine: Turn = { transaction: null, holding: true, writer: true }
      try {
        return await turns.run(mine, () => begin(options, (transaction: Transaction) => {
          mine.transaction = transaction
          return callback(transaction)
        }))
      }
      finally {
        mine.holding = false
      }
    }),
    statement: (sql, options, query) => {
      if (options?.transaction || turns.getStore()?.holding || !isWriteStatement(sql)) return query(sql, options)
      return queue.run(() => {
        const mine: Turn = { transaction: null, holding: true }
        return turns.run(mine, () => query(sql, options)).finally(() => {
          mine.holding = false
        })
      }, { ahead: true })
    },
  })
}

/*
 * Two databases, one code base. SQLite (a file, NUXT_DATABASE_PATH) is the embedded default;
 * NUXT_DATABASE_URL=postgres://… puts the same models and migrations on PostgreSQL, for
 * several app instances on one database. What differs between them is decided here and in
 * the few helpers below (dialect-sql.ts), never in routes:
 *
 * - SQLite has one writer: every write of the process waits in the write line (above).
 *   PostgreSQL serialises writers itself: each managed transaction takes one transaction-level
 *   advisory lock first (WRITER_LOCK), so the check-then-write code written for SQLite's one
 *   writer (throttle counts, look-up-then-create by request id, conditional updates) stays
 *   exact across instances, and a transaction is never half-seen by another. Reads never wait.
 * - A statement made while a transaction's callback runs still joins that transaction on
 *   both (the same AsyncLocalStorage turn), so code does not depend on the dialect.
 * - A gate plays the line's deadline (transactionGate): at most the pool's size less one
 *   transactions of an instance hold connections; one that cannot start within
 *   NUXT_WRITE_QUEUE_WAIT_MS answers 503 errors.busy before writing anything, as a full line does.
 */
export type Dialect = 'sqlite' | 'postgres'

/** Which database the settings choose: PostgreSQL when NUXT_DATABASE_URL names one. */
export function databaseDialect(url = String(useRuntimeConfig().databaseUrl ?? '')): Dialect {
  return /^postgres(ql)?:\/\//.test(url) ? 'postgres' : 'sqlite'
}

/** The key of the advisory lock every PostgreSQL write transaction holds (any constant bigint). */
const WRITER_LOCK = 7_261_730

// PostgreSQL's COUNT(*) and BIGINT come back as strings by default; every count here fits a number.
pg.types.setTypeParser(pg.types.builtins.INT8 ?? 20, (value: string) => Number.parseInt(value, 10))

const ROW_LOCKED = Symbol('row-locked')

/**
 * A transaction that claims rows one by one (claimLocks) instead of taking the writer lock:
 * on PostgreSQL several instances run it at once, each getting rows the others have not
 * locked (FOR UPDATE SKIP LOCKED), as the outbox does; on SQLite it is an ordinary
 * transaction in the write line. Keep it to reads and updates of the claimed rows.
 */
export function rowLockTransaction<T>(sequelize: Sequelize, callback: (transaction: Transaction) => Promise<T>): Promise<T> {
  return sequelize.transaction({ [ROW_LOCKED]: true } as TransactionOptions, callback)
}

/**
 * Find options that lock the rows found for the rest of the transaction and pass over rows
 * another transaction holds (SELECT … FOR UPDATE SKIP LOCKED on PostgreSQL; nothing on
 * SQLite, whose one writer holds them all).
 */
export function claimLocks(transaction: Transaction) {
  return { transaction, lock: Transaction.LOCK.UPDATE, skipLocked: true }
}

/** No connection free within NUXT_WRITE_QUEUE_WAIT_MS: 503 errors.busy with Retry-After, as a full write line answers. */
function busyWhenNoConnection(error: unknown): never {
  if ((error as Error | null)?.name === 'SequelizeConnectionAcquireTimeoutError') throw writeQueueBusy(1)
  throw error
}

/**
 * PostgreSQL: how many transactions of this process may hold a connection at once (one
 * connection of the pool is left to reads), and how long one may wait for that: past it,
 * 503 errors.busy before anything of it is written, as from the SQLite line. The wait is
 * never inside a transaction, so a write that started always finishes its request (a
 * pool that ran dry after the commit would answer 503 for a stored write).
 */
function transactionGate(slots: number, waitMs: number) {
  let busy = 0
  const waiting: { start: () => void, timer: ReturnType<typeof setTimeout> }[] = []
  const leave = () => {
    const next = waiting.shift()
    if (!next) return void busy--
    clearTimeout(next.timer)
    next.start()
  }
  return async <T>(job: () => Promise<T>): Promise<T> => {
    if (busy < slots) busy++
    else {
      await new Promise<void>((start, refuse) => {
        const waiter = { start, timer: setTimeout(() => {
          waiting.splice(waiting.indexOf(waiter), 1)
          refuse(writeQueueBusy(Math.max(1, Math.ceil(waitMs / 1000))))
        }, waitMs) }
        waiting.push(waiter)
      })
    }
    try {
      return await job()
    }
    finally {
      leave()
    }
  }
}

function serialiseWriters(sequelize: Sequelize, gate: ReturnType<typeof transactionGate>) {
  wrapWrites(sequelize, {
    transaction: ({ [ROW_LOCKED]: rowLocked, ...options }, callback, begin, query) => {
      const mine: Turn = { transaction: null, holding: true }
      return gate(() => turns.run(mine, () => begin(options, async (transaction: Transaction) => {
        mine.transaction = transaction
        if (!rowLocked) await query(`SELECT pg_advisory_xact_lock(${WRITER_LOCK})`, { transaction })
        return callback(transaction)
      }))).catch(busyWhenNoConnection).finally(() => {
        mine.holding = false
      })
    },
    statement: (sql, options, query) => query(sql, options).catch(busyWhenNoConnection),
  })
}

function connectSqlite(config: ReturnType<typeof useRuntimeConfig>): Sequelize {
  const storage = resolve(config.databasePath)
  mkdirSync(dirname(storage), { recursive: true })
  const sequelize = new Sequelize({
    dialect: 'sqlite',
    dialectModule: sqlite3,
    storage,
    logging: false,
    // IMMEDIATE takes the write lock at BEGIN, so two writers queue instead of deadlocking.
    transactionType: Transaction.TYPES.IMMEDIATE,
    retry: { max: 5, match: [/SQLITE_BUSY/] },
  })
  configureEachConnection(sequelize)
  writeQueue = createWriteQueue({ max: Number(config.writeQueueMax ?? 200), waitMs: Number(config.writeQueueWaitMs ?? 10_000) })
  queueWrites(sequelize, writeQueue)
  return sequelize
}

function connectPostgres(config: ReturnType<typeof useRuntimeConfig>): Sequelize {
  const poolMax = Math.max(2, Number(config.databasePoolMax ?? 10))
  const sequelize = new Sequelize(String(config.databaseUrl), {
    dialect: 'postgres',
    dialectModule: pg,
    logging: false,
    // A read waits for a connection as long as a request may take; the transactions' own wait is the gate's.
    pool: { max: poolMax, min: 0, acquire: 60_000, idle: 10_000 },
  })
  serialiseWriters(sequelize, transactionGate(Math.max(1, poolMax - 1), Number(config.writeQueueWaitMs ?? 10_000)))
  return sequelize
}

async function connect(): Promise<Sequelize> {
  const config = useRuntimeConfig()
  const postgres = databaseDialect() === 'postgres'
  const sequelize = postgres ? connectPostgres(config) : connectSqlite(config)
  if (!postgres) await sequelize.query('PRAGMA journal_mode = WAL;')
  initModels(sequelize)
  schemaSettled = false
  tableInfo.clear()
  await migrateOnce(sequelize)
  schemaSettled = true
  return sequelize
}

/*
 * SQL that reads differently on the two databases, for the few queries written by hand
 * (the access history's groups). Everything else is plain SQL both accept.
 */

/**
 * A where condition for a column holding `text`, ignoring case (the queue's search by name or
 * clinic number): LIKE on SQLite, which ignores the case of ASCII letters; ILIKE on
 * PostgreSQL, whose LIKE does not. The wildcards in `text` are matched as themselves.
 */
export function textContains(text: string) {
  const like = `%${text.replace(/[\\%_]/g, c => `\\${c}`)}%`
  return databaseDialect() === 'postgres' ? { [Op.iLike]: like } : { [Op.like]: like }
}

/** `column GLOB pattern` (SQLite's case-sensitive wildcard match: * ? [..]); a regular expression on PostgreSQL. */
export function sqlGlob(column: string, pattern: string): string {
  if (databaseDialect() === 'sqlite') return `${column} GLOB '${pattern.replace(/'/g, '\'\'')}'`
  const regex = pattern.replace(/\[[^\]]*\]|[*?]|[^*?[]+/g, part =>
    part === '*' ? '.*' : part === '?' ? '.' : part.startsWith('[') ? part : part.replace(/[.+^${}()|\\]/g, '\\$&'))
  return `${column} ~ '^${regex.replace(/'/g, '\'\'')}$'`
}

/** The distinct values of `expression` in a group, joined with commas. */
export function sqlDistinctList(expression: string): string {
  return databaseDialect() === 'sqlite' ? `GROUP_CONCAT(DISTINCT ${expression})` : `STRING_AGG(DISTINCT ${expression}, ',')`
}

/**
 * The calendar day (YYYY-MM-DD) of the instant in `column` in a time zone. PostgreSQL knows
 * the zone; SQLite does not, so the caller's `sqliteDay` (the zone's offsets written out)
 * is used there.
 */
export function sqlDayIn(timeZone: string, column: string, sqliteDay: () => string): string {
  if (databaseDialect() === 'sqlite') return sqliteDay()
  return `TO_CHAR(${column} AT TIME ZONE '${timeZone.replace(/'/g, '')}', 'YYYY-MM-DD')`
}

/**
 * A real write for the readiness check, in the caller's transaction. SQLite: read the
 * database header's user_version and write the same value back (a read-only file or folder,
 * a lost lock or a failing disk makes it fail). PostgreSQL: take a transaction id, which a
 * read-only server (a standby, a full disk in read-only mode) refuses. No data changes.
 */
export async function probeWrite(sequelize: Sequelize, transaction: Transaction) {
  if (sequelize.getDialect() === 'postgres') {
    await sequelize.query('SELECT txid_current()', { transaction })
    return
  }
  const [row] = await sequelize.query<{ user_version: number }>('PRAGMA user_version', { type: QueryTypes.SELECT, transaction })
  await sequelize.query(`PRAGMA user_version = ${Math.trunc(Number(row?.user_version ?? 0))}`, { transaction })
}

/** Key of the advisory lock held while migrations run, so two instances starting at once take turns. */
const MIGRATION_LOCK = 7_261_731

async function migrateOnce(sequelize: Sequelize) {
  if (sequelize.getDialect() !== 'postgres') return migrate(sequelize)
  // A session-level lock lives on one connection: hold one for the whole run.
  const connection = await (sequelize.connectionManager as unknown as { getConnection: () => Promise<PgClient>, releaseConnection: (c: PgClient) => Promise<void> }).getConnection()
  try {
    await connection.query(`SELECT pg_advisory_lock(${MIGRATION_LOCK})`)
    return await migrate(sequelize)
  }
  finally {
    await connection.query(`SELECT pg_advisory_unlock(${MIGRATION_LOCK})`).catch(() => undefined)
    await (sequelize.connectionManager as unknown as { releaseConnection: (c: PgClient) => Promise<void> }).releaseConnection(connection)
  }
}

/** The one shared connection, created and migrated on first use. */
export function useDb(): Promise<Sequelize> {
  ready ??= connect().catch((error) => {
    ready = undefined
    throw error
  })
  return ready
}

/**
 * The database once the demo clinic is seeded (when asked). Seeding runs through the same
 * code as requests (which wait on useDb), so it starts only after useDb is ready; the
 * start-up plugin and the readiness route wait on this.
 */
export function whenSeeded(): Promise<Sequelize> {
  seeded ??= useDb().then(async (sequelize) => {
    const config = useRuntimeConfig()
    if (config.seedDemo) await seedDemoClinic(sequelize)
    if (config.seedDemo && config.seedDemoActivity) await seedDemoActivity(sequelize)
    return sequelize
  }).catch((error) => {
    seeded = undefined
    throw error
  })
  return seeded
}
