import { AsyncLocalStorage } from 'node:async_hooks'
import type { Sequelize } from 'sequelize'

/*
 * Test-only: how many SQL statements a request made. With NUXT_COUNT_QUERIES=1 each request
 * runs with a counter in AsyncLocalStorage, every statement Sequelize runs adds one to the
 * counters of the request that made it and of the requests around it (the internal API
 * calls of a server render add to the page's), and the response says the total in the
 * `x-query-count` header. Off (the default) nothing is wrapped and no hook is added.
 */

export interface QueryCounter {
  count: number
  parent: QueryCounter | null
}

const current = new AsyncLocalStorage<QueryCounter>()

export const QUERY_COUNT_HEADER = 'x-query-count'

export function queryCountingEnabled(): boolean {
  return process.env.NUXT_COUNT_QUERIES === '1' || process.env.NUXT_COUNT_QUERIES === 'true'
}

/** Runs fn with a new counter nested in the current one (if any). */
export function withQueryCounter<T>(fn: (counter: QueryCounter) => T): T {
  const counter: QueryCounter = { count: 0, parent: current.getStore() ?? null }
  return current.run(counter, () => fn(counter))
}

/** Sequelize gives each query() call its own options object, and a retry reuses it. */
const counted = new WeakSet<object>()

export function countQueries(sequelize: Sequelize) {
  sequelize.addHook('beforeQuery', (options: object) => {
    // A statement retried after SQLITE_BUSY counts once: the figure is what the code asks for.
    if (counted.has(options)) return
    counted.add(options)
    for (let counter = current.getStore() ?? null; counter; counter = counter.parent) counter.count++
  })
}
