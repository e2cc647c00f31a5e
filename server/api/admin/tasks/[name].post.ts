import { z } from 'zod'

// slot: run as that tick of the schedule, once across instances (server/utils/core/task-runs.ts).
const bodySchema = z.object({ now: z.string().datetime().optional(), slot: z.string().min(1).max(100).optional() }).strict()
const TASKS = ['outbox:send', 'triage:escalate', 'triage:overdue', 'diary:remind', 'schedule:reminders', 'attachments:prune'] as const

/**
 * Runs a scheduled task now (admins). A test may pass `now` to run it as of another time,
 * only when NUXT_ALLOW_CLOCK_OVERRIDE is set (never in production).
 */
export default defineEventHandler(async (event) => {
  await requireRole(event, ['admin'])
  const name = getRouterParam(event, 'name') ?? ''
  const body = await readValidatedBody(event, parseWith(bodySchema))
  if (!(TASKS as readonly string[]).includes(name)) throw createError({ statusCode: 404, message: 'errors.notFound' })
  if (body.now && !useRuntimeConfig().allowClockOverride) throw createError({ statusCode: 403, message: 'errors.forbidden' })
  const { result } = await runTask(name, { payload: { now: body.now, slot: body.slot } })
  return { task: name, result }
})
