import { AsyncLocalStorage } from 'node:async_hooks'
import { mkdirSync } from 'node:fs'
import { dirname, resolve } from 'node:path'
import { Sequelize, Transaction } from 'sequelize'
import sqlite3 from 'sqlite3'
import { SequelizeStorage, Umzug } from 'umzug'
import { migrations } from '../db/migrations'
import { initModels } from '../db/models'
import { seedDemoActivity } from '../db/seed/activity'
import { seedDemoClinic } from '../db/seed/demo'

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

/**
 * Sequelize opens one SQLite connection per transaction and turns foreign keys on for
 * each, but has no hook for other per-connection settings on this dialect: wrap
 * getConnection to give every connection a busy timeout.
 */
function configureEachConnection(sequelize: Sequelize) {
  const manager = sequelize.connectionManager as unknown as { getConnection: (options?: object) => Promise<Connection> }
  const open = manager.getConnection.bind(manager)
  manager.getConnection = async (options) => {
    const connection = await open(options)
    if (!connection.tidewellConfigured) {
      connection.configure('busyTimeout', 5000)
      connection.tidewellConfigured = true
    }
    return connection
  }
}

/*
 * SQLite has one writer at a time, and every transaction here takes the write lock at
 * BEGIN. Left to SQLite, the waiting happens in its busy handler on node-sqlite3's worker
 * threads, and measured on this server eight diaries sent at once stalled until the busy
 * timeout and seven of them failed. So this process's managed transactions
 * (sequelize.transaction(callback)) wait their turn in JavaScript, one after another; one
 * started inside another's callback runs at once, as before. Queries inside a transaction
 * pass it (see getSettings), so none waits on the shared connection.
 */
function queueTransactions(sequelize: Sequelize) {
  const inside = new AsyncLocalStorage<true>()
  const begin = sequelize.transaction.bind(sequelize) as (...args: unknown[]) => Promise<unknown>
  let tail: Promise<unknown> = Promise.resolve()
  sequelize.transaction = ((...args: unknown[]) => {
    const managed = args.some(arg => typeof arg === 'function')
    if (!managed || inside.getStore()) return begin(...args)
    const run = () => inside.run(true, () => begin(...args))
    const result = tail.then(run, run)
    tail = result.catch(() => undefined)
    return result
  }) as Sequelize['transaction']
}

async function connect(): Promise<Sequelize> {
  const config = useRuntimeConfig()
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
  queueTransactions(sequelize)
  await sequelize.query('PRAGMA journal_mode = WAL;')
  initModels(sequelize)
  await migrate(sequelize)
  return sequelize
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
