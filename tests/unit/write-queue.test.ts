import { AsyncLocalStorage } from 'node:async_hooks'
import { describe, expect, it } from 'vitest'
import { createWriteQueue, isWriteQueueBusy } from '../../server/utils/core/write-queue'

/** A job that runs until its release() is called, and says whether it started. */
function gate() {
  let release!: () => void
  const state = { started: false }
  const done = new Promise<void>(r => (release = r))
  return { state, release, job: async () => { state.started = true; await done; return 'done' } }
}

const settle = <T>(p: Promise<T>) => p.then(value => ({ value }), (error: unknown) => ({ error }))

describe('write queue', () => {
  it('runs one job at a time, in the order they came', async () => {
    const queue = createWriteQueue({ max: 10, waitMs: 10_000 })
    const order: string[] = []
    let running = 0
    let most = 0
    const job = (name: string) => async () => {
      running++
      most = Math.max(most, running)
      order.push(`start ${name}`)
      await new Promise(r => setTimeout(r, 5))
      order.push(`end ${name}`)
      running--
      return name
    }
    expect(await Promise.all(['a', 'b', 'c'].map(n => queue.run(job(n))))).toEqual(['a', 'b', 'c'])
    expect(most).toBe(1)
    expect(order).toEqual(['start a', 'end a', 'start b', 'end b', 'start c', 'end c'])
  })

  it('refuses at once with 503 errors.busy when max jobs already wait, and never starts the refused one', async () => {
    const queue = createWriteQueue({ max: 2, waitMs: 10_000 })
    const first = gate()
    const running = queue.run(first.job)
    const waiting = [queue.run(async () => 'w1'), queue.run(async () => 'w2')]
    let ran = false
    const refused = await settle(queue.run(async () => { ran = true }))
    expect('error' in refused && isWriteQueueBusy(refused.error)).toBe(true)
    expect((refused as { error: { statusCode: number, message: string, data: { retryAfter: number } } }).error).toMatchObject({ statusCode: 503, message: 'errors.busy' })
    expect((refused as { error: { data: { retryAfter: number } } }).error.data.retryAfter).toBeGreaterThanOrEqual(1)
    first.release()
    expect(await running).toBe('done')
    expect(await Promise.all(waiting)).toEqual(['w1', 'w2'])
    expect(ran).toBe(false)
    expect(queue.state()).toMatchObject({ running: false, waiting: 0, refused: 1 })
  })

  it('refuses a job that waited past its deadline without starting it; the line goes on', async () => {
    const queue = createWriteQueue({ max: 10, waitMs: 20 })
    const first = gate()
    const running = queue.run(first.job)
    const late = gate()
    const refused = await settle(queue.run(late.job))
    expect('error' in refused && isWriteQueueBusy(refused.error)).toBe(true)
    expect(late.state.started).toBe(false)
    first.release()
    await running
    expect(await queue.run(async () => 'after')).toBe('after')
    expect(late.state.started).toBe(false)
  })

  it('lone statements go ahead of the waiting transactions, in their own order', async () => {
    const queue = createWriteQueue({ max: 10, waitMs: 10_000 })
    const first = gate()
    const order: string[] = []
    const job = (name: string) => async () => {
      order.push(name)
    }
    const all = [
      queue.run(first.job),
      queue.run(job('tx1')),
      queue.run(job('tx2')),
      queue.run(job('lone1'), { ahead: true }),
      queue.run(job('lone2'), { ahead: true }),
    ]
    first.release()
    await Promise.all(all)
    expect(order).toEqual(['lone1', 'lone2', 'tx1', 'tx2'])
  })

  it('a job that waited runs in its caller\'s async context, not in the one before it', async () => {
    const queue = createWriteQueue({ max: 10, waitMs: 10_000 })
    const request = new AsyncLocalStorage<string>()
    const first = gate()
    const running = request.run('first', () => queue.run(first.job))
    const seen = request.run('second', () => queue.run(async () => request.getStore()))
    first.release()
    await running
    expect(await seen).toBe('second')
  })

  it('a failing job rejects its own caller only', async () => {
    const queue = createWriteQueue({ max: 10, waitMs: 10_000 })
    const results = await Promise.all([
      settle(queue.run(async () => { throw new Error('boom') })),
      settle(queue.run(async () => 'fine')),
    ])
    expect((results[0] as { error: Error }).error.message).toBe('boom')
    expect(results[1]).toEqual({ value: 'fine' })
  })
})
