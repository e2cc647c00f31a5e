import { afterAll, describe, expect, it } from 'vitest'
import { evaluateTriage } from '#shared/triage/rules'
import { RISK_FACTORS, emptyRiskProfile } from '#shared/triage/risk-profile'
import type { RiskProfile } from '#shared/triage/risk-profile'
import { diaryEntrySchema, diaryEntryWith, emptyDiaryEntry } from '#shared/diary/schemas'
import type { DiaryEntryInput } from '#shared/diary/schemas'
import { CONTROLS, LEVEL_ORDER, VIGNETTES, VIGNETTE_GROUPS, rank } from './vignettes'
import type { Changes, Control, Level, Vignette } from './vignettes'

/*
 * The clinical vignette suite (issue 9). Each case is a realistic man written from the
 * published sources in ../shared/REFERENCES.md (or marked "common practice" / "from
 * memory"), not from the triage rules, so a case can disagree with the engine. The test
 * is one-sided: the engine's level must be AT LEAST the case's floor. An under-triaged
 * case fails and its name gives the case and its source. Over-triage by two or more
 * levels does not fail; it is listed in a table at the end for the team to review.
 * Negative controls (nothing to report) must give exactly "none".
 */

const SUBMITTED_AT = new Date('2026-11-30T15:00:00Z')

function parsed(changes: Changes, where: string): DiaryEntryInput {
  const result = diaryEntrySchema.safeParse(diaryEntryWith(changes))
  if (!result.success) {
    const issues = result.error.issues.map(issue => `${issue.path.join('.')}: ${issue.message}`).join('; ')
    throw new Error(`${where} is not a valid diary entry: ${issues}`)
  }
  return result.data
}

interface Case {
  id: string
  entry: Changes
  flareWatch?: boolean
  baseline?: Changes[]
  risk?: Partial<RiskProfile>
  noRiskProfile?: boolean
}

function triage(c: Case, entryChanges: Changes = c.entry) {
  const entry = parsed(entryChanges, `${c.id} entry`)
  const baseline = (c.baseline ?? []).map((previous, index) => parsed(previous, `${c.id} baseline[${index}]`))
  const riskProfile = c.noRiskProfile ? undefined : { ...emptyRiskProfile(), ...c.risk }
  const result = evaluateTriage(entry, {
    flareWatchActive: c.flareWatch === true,
    baseline,
    submittedAt: SUBMITTED_AT,
    timeZone: 'UTC',
    riskProfile,
  })
  return { level: result.level as string, rules: result.reasons.map(reason => reason.rule).join(', ') || '(no reasons)' }
}

const context = (v: Vignette) => [
  v.flareWatch ? 'flare watch' : null,
  v.risk ? Object.entries(v.risk).filter(([, on]) => on).map(([factor]) => factor).join('+') : null,
  v.baseline?.length ? `${v.baseline.length} previous` : null,
].filter(Boolean).join(', ')

const caseName = (v: Vignette) => `${v.id} ${v.story}${context(v) ? ` [${context(v)}]` : ''}: at least ${v.minimum} (${v.source})`

const overTriaged: { id: string, floor: Level, got: string, rules: string, story: string }[] = []
const underTriaged: { id: string, floor: Level, got: string, rules: string, source: string }[] = []

afterAll(() => {
  if (underTriaged.length > 0) {
    console.log(`\nUnder-triaged vignettes (${underTriaged.length} of ${VIGNETTES.length}): these FAIL`)
    console.table(underTriaged)
  }
  if (overTriaged.length > 0) {
    console.log(`\nOver-triaged by two or more levels (${overTriaged.length}; listed for review, not failing)`)
    console.table(overTriaged)
  }
})

for (const [group, vignettes] of Object.entries(VIGNETTE_GROUPS)) {
  describe(`vignettes: ${group}`, () => {
    it.each(vignettes.map(v => [caseName(v), v] as const))('%s', (_name, v) => {
      const { level, rules } = triage(v)
      if (rank(level) < rank(v.minimum)) underTriaged.push({ id: v.id, floor: v.minimum, got: level, rules, source: v.source })
      if (rank(level) - rank(v.minimum) >= 2) overTriaged.push({ id: v.id, floor: v.minimum, got: level, rules, story: v.story })
      expect(
        rank(level),
        `${v.id} under-triaged: got ${level} (${rules}), the floor is ${v.minimum}. ${v.story}. Source: ${v.source}${v.why ? `. Why: ${v.why}` : ''}`,
      ).toBeGreaterThanOrEqual(rank(v.minimum))
    })
  })
}

describe('vignettes: combinations rank at least as high as each sign alone', () => {
  const combinations = VIGNETTES.filter(v => v.parts && v.parts.length > 0)
  it.each(combinations.map(v => [`${v.id} ${v.story}: together >= each part alone, each part >= its own floor`, v] as const))('%s', (_name, v) => {
    const together = triage(v)
    for (const part of v.parts!) {
      const alone = triage(v, part.entry)
      expect(
        rank(alone.level),
        `${v.id} part "${part.label}" alone under-triaged: got ${alone.level} (${alone.rules}), the floor is ${part.minimum}`,
      ).toBeGreaterThanOrEqual(rank(part.minimum))
      expect(
        rank(together.level),
        `${v.id}: together ${together.level} (${together.rules}) ranks lower than "${part.label}" alone, ${alone.level} (${alone.rules})`,
      ).toBeGreaterThanOrEqual(rank(alone.level))
    }
  })
})

describe('vignettes: negative controls (nothing to report gives none)', () => {
  it.each(CONTROLS.map(c => [`${c.id} ${c.story}: exactly ${c.exactly} (${c.source})`, c] as const))('%s', (_name, c: Control) => {
    const { level, rules } = triage(c)
    expect(level, `${c.id}: got ${level} (${rules}), expected ${c.exactly}`).toBe(c.exactly)
  })
})

/* Checks on the suite itself, so it keeps covering what issue 9 asks as it grows. */
describe('vignettes: the suite itself', () => {
  const everyCase: Case[] = [...VIGNETTES, ...CONTROLS]

  it('has at least 100 vignettes and unique ids, each with a source', () => {
    expect(VIGNETTES.length).toBeGreaterThanOrEqual(100)
    const ids = everyCase.map(c => c.id)
    expect(new Set(ids).size).toBe(ids.length)
    for (const v of VIGNETTES) {
      expect(v.source.trim(), `${v.id} has no source`).not.toBe('')
      expect(LEVEL_ORDER, `${v.id} has an unknown floor`).toContain(v.minimum)
    }
  })

  it('has no vignette whose floor is none (a floor of none asserts nothing)', () => {
    expect(VIGNETTES.filter(v => v.minimum === 'none').map(v => v.id)).toEqual([])
  })

  it('gives each combination a floor above every one of its parts', () => {
    for (const v of VIGNETTES.filter(v => v.parts)) {
      for (const part of v.parts!) {
        expect(rank(v.minimum), `${v.id}: "${part.label}" alone has floor ${part.minimum}, not below the combination's ${v.minimum}`)
          .toBeGreaterThan(rank(part.minimum))
      }
    }
  })

  it('asks every diary answer away from its all-no value in at least one vignette', () => {
    const leaves = (node: unknown, prefix: string): string[] =>
      node && typeof node === 'object' && !Array.isArray(node)
        ? Object.entries(node).flatMap(([key, value]) => leaves(value, prefix ? `${prefix}.${key}` : key))
        : [prefix]
    const at = (root: unknown, path: string): unknown =>
      path.split('.').reduce<unknown>((node, key) => (node && typeof node === 'object' ? (node as Record<string, unknown>)[key] : undefined), root)
    const empty = emptyDiaryEntry()
    const entries = VIGNETTES.map(v => parsed(v.entry, v.id))
    const untouched = leaves(empty, '').filter(path =>
      !entries.some(entry => JSON.stringify(at(entry, path)) !== JSON.stringify(at(empty, path))))
    expect(untouched, 'diary answers no vignette changes').toEqual([])
    const optional: [string, (entry: DiaryEntryInput) => boolean][] = [
      ['IPSS', entry => entry.urinary.ipss !== undefined],
      ['glucose in mg/dL', entry => entry.sugar.glucose?.unit === 'mg/dL'],
      ['glucose in mmol/L', entry => entry.sugar.glucose?.unit === 'mmol/L'],
      ['temperature in °C', entry => entry.infection.temperature?.unit === '°C'],
      ['temperature in °F', entry => entry.infection.temperature?.unit === '°F'],
      ['note', entry => (entry.note ?? '').trim() !== ''],
    ]
    for (const [label, present] of optional) expect(entries.some(present), `no vignette has ${label}`).toBe(true)
    for (const location of ['back', 'neck', 'ribs', 'hips', 'legs', 'arms', 'other'] as const) {
      expect(entries.some(entry => entry.pain.locations.includes(location)), `no vignette has pain in ${location}`).toBe(true)
    }
  })

  it('raises through every risk factor, the flare watch and a previous report', () => {
    for (const factor of RISK_FACTORS) {
      expect(VIGNETTES.some(v => v.risk?.[factor] === true), `no vignette with ${factor}`).toBe(true)
    }
    expect(VIGNETTES.some(v => v.flareWatch)).toBe(true)
    expect(VIGNETTES.some(v => (v.baseline?.length ?? 0) > 0)).toBe(true)
  })

  it('states numbers in the stories that match the answers (re-derived here)', () => {
    const checked = { ipss: 0, glucose: 0, temperature: 0, pain: 0 }
    for (const v of VIGNETTES) {
      const entry = parsed(v.entry, v.id)
      // IPSS total (Barry 1992): the sum of the seven items, quality of life not added.
      const ipss = /IPSS (?:exactly )?(\d+)/.exec(v.story)
      if (ipss && entry.urinary.ipss) {
        expect(entry.urinary.ipss.items.reduce((sum, item) => sum + item, 0), `${v.id} IPSS total`).toBe(Number(ipss[1]))
        checked.ipss++
      }
      // Glucose: mg/dL = mmol/L x 18.016 (REFERENCES.md, low blood sugar).
      const glucose = /([\d.]+) mmol\/L \((\d+) mg\/dL\)/.exec(v.story)
      if (glucose) {
        expect(Math.abs(Number(glucose[1]) * 18.016 - Number(glucose[2])), `${v.id} glucose conversion`).toBeLessThan(1)
        checked.glucose++
      }
      // Temperature: °C = (°F - 32) / 1.8.
      const temperature = /([\d.]+) °F \(([\d.]+) °C\)/.exec(v.story)
      if (temperature) {
        expect((Number(temperature[1]) - 32) / 1.8, `${v.id} temperature conversion`).toBeCloseTo(Number(temperature[2]), 1)
        checked.temperature++
      }
      // The pain score named first in the story is the entry's worst pain.
      const pain = /pain (\d+)\/10/.exec(v.story)
      if (pain) {
        expect(entry.pain.worst, `${v.id} pain score`).toBe(Number(pain[1]))
        checked.pain++
      }
    }
    for (const [kind, count] of Object.entries(checked)) expect(count, `no story states a ${kind} number`).toBeGreaterThan(0)
  })

  it('reaches every level above none as a floor', () => {
    for (const level of ['routine', 'urgent', 'emergency'] as const) {
      expect(VIGNETTES.some(v => v.minimum === level), `no vignette with floor ${level}`).toBe(true)
    }
  })
})
