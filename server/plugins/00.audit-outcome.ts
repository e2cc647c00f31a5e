import type { H3Event } from 'h3'
import { createError, setResponseHeader, setResponseStatus } from 'h3'

/*
 * The audit line of a granted access is written when the request has finished, with what
 * happened (server/utils/audit/audit.ts, DEVELOPERS.md "Audit outcomes"): authorizePatient only
 * keeps it in event.context (deferAudit).
 * - A handler that returns: the beforeResponse hook writes it with the response status,
 *   before the answer goes out. If that write is refused (the write line is full), a read
 *   answers 503 instead of its data: no patient data leaves without its line.
 * - A handler that throws: h3 hands the error to Nitro's error handler, which sends the
 *   answer itself, so neither beforeResponse nor afterResponse runs and the error hook is not
 *   awaited. The wrapper below catches the error first, writes the line with its status and
 *   throws it on unchanged.
 * - A handler that sends the answer itself (a redirect, a stream): afterResponse.
 * The wrapper also opens the request scope that lets a server render's internal API calls
 * record the browser's address (request-scope.ts).
 */
export default defineNitroPlugin((nitroApp) => {
  const handler = nitroApp.h3App.handler
  nitroApp.h3App.handler = (event: H3Event) => withRequestScope(event, async () => {
    try {
      return await handler(event)
    }
    catch (error) {
      const status = createError(error as Error).statusCode || 500
      await settleAudit(event, status).catch(cause => console.error('[audit] line not written', cause))
      throw error
    }
  })

  nitroApp.hooks.hook('beforeResponse', async (event, response) => {
    try {
      await settleAudit(event, event.node.res.statusCode || 200)
    }
    catch (cause) {
      console.error('[audit] line not written', cause)
      if (event.method !== 'GET' && event.method !== 'HEAD') return
      const busy = isWriteQueueBusy(cause) ? cause.data.retryAfter : 1
      setResponseStatus(event, 503)
      setResponseHeader(event, 'retry-after', busy)
      response.body = { statusCode: 503, message: 'errors.busy', data: { retryAfter: busy } }
    }
  })

  nitroApp.hooks.hook('afterResponse', async (event) => {
    await settleAudit(event, event.node.res.statusCode || 200).catch(cause => console.error('[audit] line not written', cause))
  })
})
