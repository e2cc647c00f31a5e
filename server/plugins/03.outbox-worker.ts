/** Sends queued e-mails every few seconds; a failed message waits for its backoff. */
export default defineNitroPlugin((nitroApp) => {
  const every = Number(useRuntimeConfig().outboxPollMs)
  if (!every) return
  const timer = setInterval(() => {
    processOutbox().catch(error => console.error('[tidewell] outbox', error))
  }, every)
  timer.unref()
  nitroApp.hooks.hook('close', () => clearInterval(timer))
})
