import { randomUUID } from 'node:crypto'
import { hostname } from 'node:os'
import { Op, UniqueConstraintError } from 'sequelize'
import { TaskRun } from '../../db/models'

/*
 * Scheduled tasks with several app instances on one database (issue 14). Every instance
 * runs the same cron lines, so each run first claims its slot, one row of task_runs
 * (migration 0018, unique per task and slot): the instance whose insert wins runs the
 * task, the others skip it. A cron tick's slot is its minute, the same on every instance;
 * a run an admin (or a test) asks for gets a fresh slot unless it names one. While it
 * runs, the holder renews its lease; a run whose lease has passed was interrupted (its
 * instance died), and the next instance to look (resumeInterruptedTasks, every
 * NUXT_TASK_RESUME_MS) takes it over and runs the task again as of the same instant. The
 * tasks are sweeps over what is due and their e-mails carry dedupe keys, so a second run
 * after a crash finishes the work without doing any of it twice.
 */

/** This process, as the holder of the runs it claims. */
const HOLDER = `${hostname()}:${process.pid}:${randomUUID().slice(0, 8)}`

const leaseMs = () => Number(useRuntimeConfig().taskLeaseMs ?? 120_000)

export interface TaskRunPayload {
  /** The instant to run as of (tests, with NUXT_ALLOW_CLOCK_OVERRIDE). */
  now?: unknown
  /** The slot to claim: the same on every instance for the same tick. */
  slot?: unknown
  /** Set by Nitro's cron runner. */
  scheduledTime?: unknown
  /** The id of an interrupted run this instance has taken over. */
  resumeRun?: unknown
}

/** What a run answers: the task's result, or the slot another instance claimed first. */
export type TaskRunResult<T> = { result: T | { ranElsewhere: string } }

function slotOf(payload: TaskRunPayload, asOf: Date): string {
  if (typeof payload.slot === 'string' && payload.slot) return payload.slot
  if (payload.scheduledTime !== undefined && payload.now === undefined) return `tick:${asOf.toISOString().slice(0, 16)}`
  return `asked:${randomUUID()}`
}

/** Claims a new run, or takes the resumed one; undefined when another instance holds the slot. */
async function claimRun(name: string, payload: TaskRunPayload): Promise<TaskRun | undefined> {
  await useDb()
  if (typeof payload.resumeRun === 'number') {
    const run = await TaskRun.findByPk(payload.resumeRun)
    return run?.holder === HOLDER && run.status === 'running' ? run : undefined
  }
  const runAsOf = typeof payload.now === 'string' ? new Date(payload.now) : new Date()
  try {
    return await TaskRun.create({ name, slot: slotOf(payload, runAsOf), runAsOf, holder: HOLDER, leaseUntil: new Date(Date.now() + leaseMs()) })
  }
  catch (error) {
    if (error instanceof UniqueConstraintError) return undefined
    throw error
  }
}

/**
 * Runs a scheduled task's work once across instances (see above). `work` gets the instant
 * to run as of: the given `now`, the tick's, or the interrupted run's.
 */
export async function runTaskOnce<T>(name: string, payload: TaskRunPayload, work: (now: Date) => Promise<T>): Promise<TaskRunResult<T>> {
  const run = await claimRun(name, payload)
  if (!run) return { result: { ranElsewhere: typeof payload.slot === 'string' ? payload.slot : name } }
  const mine = { where: { id: run.id, holder: HOLDER } }
  const renew = setInterval(() => {
    TaskRun.update({ leaseUntil: new Date(Date.now() + leaseMs()) }, mine).catch(error => console.error('[tidewell] task lease', error))
  }, Math.max(50, leaseMs() / 3))
  renew.unref()
  try {
    const result = await work(run.runAsOf)
    await TaskRun.update({ status: 'done', finishedAt: new Date() }, mine)
    return { result }
  }
  catch (error) {
    await TaskRun.update({ status: 'failed', finishedAt: new Date() }, mine).catch(() => undefined)
    throw error
  }
  finally {
    clearInterval(renew)
  }
}

/**
 * Takes over runs whose holder stopped renewing its lease (it died mid-run) and runs each
 * again here. Taking one over is a conditional update (still the old holder, lease still
 * passed), so of two instances looking at once only one gets it. Returns how many were resumed.
 */
export async function resumeInterruptedTasks(runNamed: (name: string, payload: TaskRunPayload) => Promise<unknown>): Promise<number> {
  await useDb()
  const stale = await TaskRun.findAll({ where: { status: 'running', leaseUntil: { [Op.lt]: new Date() } }, order: [['id', 'ASC']], limit: 10 })
  let resumed = 0
  for (const run of stale) {
    const [taken] = await TaskRun.update(
      { holder: HOLDER, leaseUntil: new Date(Date.now() + leaseMs()), attempts: run.attempts + 1 },
      { where: { id: run.id, status: 'running', holder: run.holder, leaseUntil: { [Op.lt]: new Date() } } },
    )
    if (!taken) continue
    resumed++
    await runNamed(run.name, { resumeRun: run.id }).catch(error => console.error(`[tidewell] resuming ${run.name}`, error))
  }
  return resumed
}
