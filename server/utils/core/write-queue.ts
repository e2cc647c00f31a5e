import { AsyncResource } from 'node:async_hooks'
import { createError } from 'h3'

/**
 * The one line every write of this process waits in (see "The write path" in
 * DEVELOPERS.md). One job runs at a time, in the order they came. At most `max` jobs wait
 * behind the running one; a job that would be one more, or that has waited `waitMs`
 * without starting, is refused at once with a 503 (errors.busy) that says when to try
 * again. A refused job never starts, so nothing of it is written. A lone statement (an
 * audit line of a read, a one-row update) may go ahead of the waiting transactions
 * (`{ ahead: true }`): it takes a moment, and a nurse's read that writes its audit line
 * should not wait behind fifty diaries. Lone statements keep their order among themselves.
 */
export interface WriteQueueOptions {
  /** How many jobs may wait behind the running one. */
  max: number
  /** How long a job may wait for its turn, in milliseconds. */
  waitMs: number
}

export interface WriteQueue {
  run: <T>(job: () => Promise<T>, options?: { ahead?: boolean }) => Promise<T>
  /** For the readiness check and the tests: whether a job runs and how many wait. */
  state: () => { running: boolean, waiting: number, refused: number }
}

interface Waiter {
  start: () => Promise<void>
  timer: ReturnType<typeof setTimeout>
}

/** The H3 error a refused job rejects with; its data.retryAfter is whole seconds. */
export function writeQueueBusy(retryAfter: number) {
  return createError({ statusCode: 503, message: 'errors.busy', data: { retryAfter } })
}

export function isWriteQueueBusy(error: unknown): error is { statusCode: 503, data: { retryAfter: number } } {
  const e = error as { statusCode?: number, message?: string, data?: { retryAfter?: unknown } } | null
  return !!e && e.statusCode === 503 && e.message === 'errors.busy' && typeof e.data?.retryAfter === 'number'
}

export function createWriteQueue(options: WriteQueueOptions): WriteQueue {
  const max = Math.max(0, Math.floor(options.max))
  const waitMs = Math.max(1, Math.floor(options.waitMs))
  const waiting: Waiter[] = []
  // How many of the waiting, at the front, are lone statements that went ahead.
  let aheadCount = 0
  let running = false
  let refused = 0
  // A running mean of how long a job holds the line, for Retry-After.
  let meanJobMs = 10

  /** About how long the line ahead takes to clear, at least one second. */
  const retryAfter = () => Math.max(1, Math.ceil(((waiting.length + 1) * meanJobMs) / 1000))

  const next = () => {
    if (running) return
    const waiter = waiting.shift()
    if (!waiter) return
    if (aheadCount > 0) aheadCount--
    clearTimeout(waiter.timer)
    running = true
    const started = performance.now()
    void waiter.start().finally(() => {
      meanJobMs = 0.8 * meanJobMs + 0.2 * (performance.now() - started)
      running = false
      next()
    })
  }

  const run = <T>(job: () => Promise<T>, runOptions: { ahead?: boolean } = {}): Promise<T> => {
    if (running && waiting.length >= max) {
      refused++
      return Promise.reject(writeQueueBusy(retryAfter()))
    }
    // The job runs in its caller's async context (its request's), not in that of the job
    // before it, which is where its turn comes.
    const own = AsyncResource.bind(job)
    return new Promise<T>((resolve, reject) => {
      const waiter: Waiter = {
        start: () => {
          const done = Promise.resolve().then(own)
          done.then(resolve, reject)
          return done.then(() => undefined, () => undefined)
        },
        timer: setTimeout(() => {
          const at = waiting.indexOf(waiter)
          if (at < 0) return
          waiting.splice(at, 1)
          if (at < aheadCount) aheadCount--
          refused++
          reject(writeQueueBusy(retryAfter()))
        }, waitMs),
      }
      if (runOptions.ahead) waiting.splice(aheadCount++, 0, waiter)
      else waiting.push(waiter)
      next()
    })
  }

  return { run, state: () => ({ running, waiting: waiting.length, refused }) }
}
