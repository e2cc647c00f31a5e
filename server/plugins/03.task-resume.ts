/**
 * Several instances on one database: every so often, take over the scheduled-task runs
 * an instance left unfinished when it died (server/utils/core/task-runs.ts).
 */
export default defineNitroPlugin((nitroApp) => {
  const every = Number(useRuntimeConfig().taskResumeMs)
  if (!every) return
  const timer = setInterval(() => {
    resumeInterruptedTasks((name, payload) => runTask(name, { payload: payload as Record<string, unknown> })).catch(error => console.error('[tidewell] task resume', error))
  }, every)
  timer.unref()
  nitroApp.hooks.hook('close', () => clearInterval(timer))
})
