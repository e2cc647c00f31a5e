import { describe, expect, it } from 'vitest'
import { isAlertMessage, retryDelayMs, sendErrorText } from '../../server/utils/mail/outbox'

// The schedules are this project's own choice (common practice: exponential backoff with a
// ceiling): ordinary e-mail at most one hour apart, alerts to staff at most two minutes.
const HOUR = 60 * 60 * 1000
const TWO_MINUTES = 2 * 60 * 1000
const BASE = 30_000 // the default NUXT_OUTBOX_RETRY_BASE_MS

describe('outbox retry schedule', () => {
  it('lets an ordinary e-mail back off from the base, doubling, up to one hour', () => {
    expect([1, 2, 3, 4].map(n => retryDelayMs(n, BASE))).toEqual([30_000, 60_000, 120_000, 240_000])
    expect(retryDelayMs(7, BASE)).toBe(1_920_000)
    expect(retryDelayMs(8, BASE)).toBe(HOUR)
    expect(retryDelayMs(40, BASE)).toBe(HOUR)
  })

  it('retries an alert after 15 s, doubling, never more than two minutes apart', () => {
    expect([1, 2, 3, 4].map(n => retryDelayMs(n, BASE, true))).toEqual([15_000, 30_000, 60_000, TWO_MINUTES])
    for (let attempts = 1; attempts <= 60; attempts++) {
      expect(retryDelayMs(attempts, BASE, true)).toBeLessThanOrEqual(TWO_MINUTES)
    }
    // After a long outage the ordinary e-mail has reached the hour; the alert has not.
    expect(retryDelayMs(20, BASE)).toBe(HOUR)
    expect(retryDelayMs(20, BASE, true)).toBe(TWO_MINUTES)
  })

  it('never retries an alert later than ordinary e-mail would (a small test base stays small)', () => {
    expect(retryDelayMs(1, 200, true)).toBe(200)
    expect(retryDelayMs(3, 200, true)).toBe(800)
    expect(retryDelayMs(1, 10 * 60 * 1000, true)).toBe(15_000)
  })

  it('knows an alert by its dedupe key', () => {
    expect(isAlertMessage({ dedupeKey: 'triageAlert:12:first:nurse@demo.tidewell.test' })).toBe(true)
    expect(isAlertMessage({ dedupeKey: 'triageEscalation:12:manual-1:clinician@demo.tidewell.test' })).toBe(true)
    expect(isAlertMessage({ dedupeKey: 'appointment-booked:3' })).toBe(false)
    expect(isAlertMessage({ dedupeKey: null })).toBe(false)
  })

  it('keeps addresses out of a stored send error', () => {
    const error = new Error('Can\'t send mail - all recipients were rejected: 550 5.1.1 <elias@demo.tidewell.test>: Recipient address rejected')
    expect(sendErrorText(error)).toBe('Can\'t send mail - all recipients were rejected: 550 5.1.1 <[address]>: Recipient address rejected')
  })
})
