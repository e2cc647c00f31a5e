import { setResponseHeader } from 'h3'

/**
 * A write refused by the write line (errors.busy, 503) tells the client when to try
 * again. The error hook runs before Nitro's error handler writes the response.
 */
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('error', (error, { event }) => {
    if (!event || event.node.res.headersSent) return
    const cause = isWriteQueueBusy(error) ? error : isWriteQueueBusy((error as { cause?: unknown }).cause) ? (error as { cause: { data: { retryAfter: number } } }).cause : null
    if (cause) setResponseHeader(event, 'Retry-After', cause.data.retryAfter)
  })
})
