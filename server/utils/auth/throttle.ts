import type { H3Event } from 'h3'
import { createError, getRequestHeader, setResponseHeader } from 'h3'
import type { Transaction } from 'sequelize'

/*
 * Request limits kept in the database (table throttle_hits, migration 0011), so they
 * survive a restart. A rule allows `max` requests per `windowMs` for one key in one scope
 * (a sliding window). Keys are hashed: the table holds no address, IP or e-mail in clear.
 * Sign-in failures have their own rules and table (sign-in-limit.ts).
 */
export interface ThrottleRule {
  scope: string
  /** Anything that names who is limited; hashed before it is stored. */
  key: string
  max: number
  windowMs: number
}

const MINUTE = 60 * 1000
const HOUR = 60 * MINUTE

/** The limits, in one place (DEVELOPERS.md "Throttling"). */
export const LIMITS = {
  /** Forgot-password requests from one address: past this, 429. */
  forgotPerIp: { max: 10, windowMs: 15 * MINUTE },
  /** Reset e-mails to one e-mail address: past this, the same 202 and no e-mail. */
  forgotPerAddress: { max: 3, windowMs: HOUR },
  /** Set-password tries (a link and a new password) from one address. */
  setPasswordPerIp: { max: 20, windowMs: 15 * MINUTE },
  /** Care-circle invitations sent for one patient, and to one e-mail address. */
  invitesPerPatient: { max: 20, windowMs: 24 * HOUR },
  invitesPerAddress: { max: 3, windowMs: 24 * HOUR },
} as const

/**
 * The client's address: the socket's, or with NUXT_TRUST_PROXY set to n (the number of
 * reverse proxies in front of Tidewell, each adding one entry to X-Forwarded-For), the
 * entry n places from the right of X-Forwarded-For: the address the outermost trusted
 * proxy saw. Entries further left are written by the client and never trusted. With the
 * setting off, X-Forwarded-For is ignored. The audit trail records the same address
 * (audit.ts); a server render's internal API calls get the browser request's.
 */
export function clientIp(event: H3Event): string {
  const own = event.node.req.socket?.remoteAddress
  // An internal call of a server render has no socket: the address is the page request's
  // (request-scope.ts). Its headers were copied from the browser and are not read.
  if (!own) {
    const outer = outerRequest()
    if (outer && outer !== event && outer.node.req.socket?.remoteAddress) return clientIp(outer)
  }
  const socket = own || 'unknown'
  const hops = trustedProxyHops()
  if (!hops) return socket
  const forwarded = (getRequestHeader(event, 'x-forwarded-for') ?? '').split(',').map(part => part.trim()).filter(Boolean)
  return forwarded[forwarded.length - hops] ?? forwarded[0] ?? socket
}

function trustedProxyHops(): number {
  const value = String(useRuntimeConfig().trustProxy ?? '').trim().toLowerCase()
  if (value === 'true') return 1
  const hops = Number(value)
  return Number.isInteger(hops) && hops > 0 ? hops : 0
}

export function ipKey(event: H3Event): string {
  return hashToken(`ip:${clientIp(event)}`)
}

export function addressKey(email: string): string {
  return `address:${email.trim().toLowerCase()}`
}

/** SQLite keeps Sequelize dates as 'YYYY-MM-DD HH:MM:SS.SSS +00:00'. */
export function parseDbDate(value: string | Date): Date {
  if (value instanceof Date) return value
  return new Date(value.replace(' ', 'T').replace(/ ?\+00:00$/, 'Z'))
}

/** Seconds until the counted hit at `at` leaves its window, at least 1. */
export function secondsUntil(at: Date, windowMs: number, now: Date): number {
  return Math.max(1, Math.ceil((at.getTime() + windowMs - now.getTime()) / 1000))
}

/**
 * Counts one request against every rule, or none when any rule is full: returns 0 when
 * counted, otherwise the seconds until the fullest rule has room. Run inside the caller's
 * transaction when given (a hit then rolls back with the work it guards), else in its own;
 * either way it is one IMMEDIATE transaction in the write line, so parallel requests
 * cannot all read "room left" and all count.
 */
export async function takeHits(rules: ThrottleRule[], transaction?: Transaction, now = new Date()): Promise<number> {
  const sequelize = await useDb()
  const work = async (t: Transaction) => {
    let wait = 0
    for (const rule of rules) {
      const [rows] = await sequelize.query(
        `SELECT at FROM throttle_hits WHERE scope = :scope AND key = :key AND at > :since
         ORDER BY at DESC LIMIT 1 OFFSET :offset`,
        { replacements: { scope: rule.scope, key: hashToken(rule.key), since: new Date(now.getTime() - rule.windowMs), offset: rule.max - 1 }, transaction: t },
      ) as [{ at: string }[], unknown]
      if (rows[0]) wait = Math.max(wait, secondsUntil(parseDbDate(rows[0].at), rule.windowMs, now))
    }
    if (wait) return wait
    for (const rule of rules) {
      await sequelize.query(
        'DELETE FROM throttle_hits WHERE scope = :scope AND at <= :since',
        { replacements: { scope: rule.scope, since: new Date(now.getTime() - rule.windowMs) }, transaction: t },
      )
      await sequelize.query(
        'INSERT INTO throttle_hits (scope, key, at) VALUES (:scope, :key, :now)',
        { replacements: { scope: rule.scope, key: hashToken(rule.key), now }, transaction: t },
      )
    }
    return 0
  }
  return transaction ? work(transaction) : sequelize.transaction(work)
}

/** 429 errors.tooManyAttempts with Retry-After (seconds), as every throttled route answers. */
export function tooManyAttempts(event: H3Event, seconds: number, message = 'errors.tooManyAttempts') {
  setResponseHeader(event, 'Retry-After', seconds)
  return createError({ statusCode: 429, message, data: { retryAfter: seconds } })
}

/** Counts the request against the rules and throws 429 when one is full. */
export async function throttle(event: H3Event, rules: ThrottleRule[], transaction?: Transaction): Promise<void> {
  const wait = await takeHits(rules, transaction)
  if (wait) throw tooManyAttempts(event, wait)
}
