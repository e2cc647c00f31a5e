import { statfs } from 'node:fs/promises'
import { dirname, resolve } from 'node:path'
import { OutboxMessage } from '../db/models'

/** How long the write probe may wait for its turn in the write line. */
const PROBE_TIMEOUT_MS = 5000

type Check = { ok: boolean, error?: string } & Record<string, unknown>

function failure(error: unknown): Check {
  return { ok: false, error: String((error as Error)?.message ?? error).slice(0, 200) }
}

function withinProbeTime<T>(work: Promise<T>): Promise<T> {
  let timer: ReturnType<typeof setTimeout> | undefined
  const timeout = new Promise<never>((_, fail) => {
    timer = setTimeout(() => fail(new Error(`no write turn within ${PROBE_TIMEOUT_MS} ms`)), PROBE_TIMEOUT_MS)
  })
  return Promise.race([work, timeout]).finally(() => clearTimeout(timer))
}

/** A real write, committed (probeWrite in server/utils/core/db.ts); nothing in the data changes. */
async function database(): Promise<Check> {
  try {
    const sequelize = await whenSeeded()
    await withinProbeTime(sequelize.transaction(transaction => probeWrite(sequelize, transaction)))
    return { ok: true }
  }
  catch (error) {
    return failure(error)
  }
}

/** Free space for the database's folder (what an unprivileged process may still use). */
async function disk(minFreeMb: number): Promise<Check> {
  try {
    const stats = await statfs(dirname(resolve(useRuntimeConfig().databasePath)))
    const freeMb = Math.floor((stats.bavail * stats.bsize) / (1024 * 1024))
    return { ok: freeMb >= minFreeMb, freeMb, minFreeMb }
  }
  catch (error) {
    return failure(error)
  }
}

/** The age of the oldest e-mail not yet accepted by the mail server. */
async function outbox(maxAgeMinutes: number): Promise<Check> {
  try {
    await whenSeeded()
    const oldest = await OutboxMessage.findOne({ where: { status: 'pending' }, attributes: ['createdAt'], order: [['createdAt', 'ASC']] })
    const oldestMinutes = oldest ? Math.floor((Date.now() - oldest.createdAt.getTime()) / 60_000) : null
    return { ok: oldestMinutes === null || oldestMinutes < maxAgeMinutes, oldestMinutes, maxAgeMinutes }
  }
  catch (error) {
    return failure(error)
  }
}

/**
 * Readiness, for a load balancer or a monitor (GET /api/health only says the process
 * answers): 200 when the database takes a write, its disk has room and no e-mail has
 * waited too long; otherwise 503, naming the checks that failed. No patient data.
 */
export default defineEventHandler(async (event) => {
  const config = useRuntimeConfig()
  const [db, space, mail] = await Promise.all([
    database(),
    disk(Number(config.readyMinFreeMb)),
    outbox(Number(config.readyMaxOutboxAgeMin)),
  ])
  const checks = { database: db, disk: space, outbox: mail }
  const failed = Object.entries(checks).filter(([, check]) => !check.ok).map(([name]) => name)
  setResponseHeader(event, 'cache-control', 'no-store')
  if (failed.length) setResponseStatus(event, 503)
  return { ok: !failed.length, failed, checks }
})
