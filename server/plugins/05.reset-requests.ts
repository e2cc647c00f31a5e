/** Works off forgot-password requests left by a restart (normally each is done at once). */
export default defineNitroPlugin((nitroApp) => {
  const every = Number(useRuntimeConfig().outboxPollMs)
  if (!every) return
  const timer = setInterval(() => {
    processResetRequests().catch(error => console.error('[tidewell] reset requests', error))
  }, every)
  timer.unref()
  nitroApp.hooks.hook('close', () => clearInterval(timer))
})
