import type { H3Event } from 'h3'
import { setResponseHeader } from 'h3'
import type { QueryCounter } from '../utils/core/query-count'

/**
 * Tests only (NUXT_COUNT_QUERIES=1): every response carries the number of SQL statements
 * its request made, so tests/api/query-counts.test.ts can hold the reads to a budget.
 * Without the setting this plugin does nothing.
 */
export default defineNitroPlugin((nitroApp) => {
  if (!queryCountingEnabled()) return
  const handler = nitroApp.h3App.handler
  nitroApp.h3App.handler = (event: H3Event) => withQueryCounter((counter) => {
    event.context.queryCounter = counter
    return handler(event)
  })
  nitroApp.hooks.hook('beforeResponse', (event) => {
    const counter = event.context.queryCounter as QueryCounter | undefined
    if (counter && !event.node.res.headersSent) setResponseHeader(event, QUERY_COUNT_HEADER, String(counter.count))
  })
  useDb().then(countQueries).catch(() => undefined)
})
