import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { evaluateTriage } from '#shared/triage/rules'
import type { DiaryEntryInput } from '#shared/diary/schemas'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { diaryEntry } from '../support/diary'
import { percentiles, report, timed } from './figures'

/** A small deterministic generator, so every run measures the same entries. */
function random(seed: number) {
  let state = seed
  return () => {
    state = (state * 1103515245 + 12345) % 2 ** 31
    return state / 2 ** 31
  }
}

function variedEntries(count: number): DiaryEntryInput[] {
  const next = random(42)
  const pick = <T>(options: readonly T[]) => options[Math.floor(next() * options.length)]!
  return Array.from({ length: count }, () => diaryEntry({
    rightNow: { newWeakness: next() < 0.01, chestPain: next() < 0.01 },
    hotFlushes: { perDay: Math.floor(next() * 12), worstSeverity: pick(['none', 'mild', 'moderate', 'severe', 'very-severe'] as const), interference: pick(['none', 'usual-activities', 'self-care'] as const) },
    pain: { worst: Math.floor(next() * 11), locations: next() < 0.5 ? ['back'] : ['hips'], newOrWorse: next() < 0.3, wakesAtNight: next() < 0.1, worseOnStraining: next() < 0.1, bandLike: next() < 0.02, tinglingOrNumbness: next() < 0.05 },
    urinary: { weakStreamOrStraining: next() < 0.2, blood: next() < 0.02, burning: next() < 0.05 },
    mood: { phq2Interest: Math.floor(next() * 4), phq2Down: Math.floor(next() * 4) },
    fatigue: pick(['none', 'eased-by-rest', 'limits-usual-activities', 'limits-self-care'] as const),
  }))
}

describe('triage engine', () => {
  it('evaluates entries per second (pure function, with a four-entry baseline)', () => {
    const entries = variedEntries(2000)
    const rounds = 50
    const start = performance.now()
    let emergencies = 0
    for (let round = 0; round < rounds; round++) {
      for (let i = 0; i < entries.length; i++) {
        const result = evaluateTriage(entries[i]!, {
          flareWatchActive: i % 7 === 0,
          baseline: [entries[(i + 1) % entries.length]!, entries[(i + 2) % entries.length]!, entries[(i + 3) % entries.length]!, entries[(i + 4) % entries.length]!],
          submittedAt: new Date('2026-03-02T15:00:00Z'),
          timeZone: 'America/Chicago',
        })
        if (result.level === 'emergency') emergencies++
      }
    }
    const seconds = (performance.now() - start) / 1000
    const evaluated = rounds * entries.length
    report('Triage engine (evaluateTriage)', {
      'entries evaluated': evaluated,
      'entries per second': Math.round(evaluated / seconds).toLocaleString('en-US'),
      'emergency share': `${((emergencies / evaluated) * 100).toFixed(1)} %`,
    })
    expect(evaluated).toBe(100_000)
  })
})

describe('POST /api/patients/:id/diary against the built server', () => {
  let app: RunningApp
  beforeAll(async () => {
    app = await startApp({ env: { NUXT_OUTBOX_POLL_MS: '0' } })
  })
  afterAll(() => app?.stop())

  it('prints the median and 95th percentile of 300 sequential submissions', async () => {
    const patient = await Client.signIn(app.url, 'patient@demo.tidewell.test')
    const id = (await patient.get('/api/_auth/session')).body.user.patientId
    const entries = variedEntries(300)
    const samples: number[] = []
    for (const entry of entries) {
      const [ms, reply] = await timed(() => patient.post(`/api/patients/${id}/diary`, entry))
      expect(reply.status).toBe(201)
      samples.push(ms)
    }
    const { median, p95, n } = percentiles(samples)
    report('POST /api/patients/:id/diary (loopback, one client, SQLite WAL)', {
      'requests': n,
      'median': `${median.toFixed(1)} ms`,
      '95th percentile': `${p95.toFixed(1)} ms`,
    })
  })
})
