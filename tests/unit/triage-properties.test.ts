import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import type { z } from 'zod'
import { RISK_FACTORS, emptyRiskProfile } from '#shared/triage/risk-profile'
import type { RiskFactor, RiskProfile } from '#shared/triage/risk-profile'
import { FATIGUE_LEVELS, HOT_FLUSH_INTERFERENCE, HOT_FLUSH_SEVERITIES } from '#shared/diary/scores'
import {
  ANSWERS_NOT_RAISING_ALONE,
  LEVELS,
  PAIN_LOCATIONS,
  RIGHT_NOW_ITEMS,
  compareLevels,
  evaluateTriage,
  rightNowTriggered,
} from '#shared/triage/rules'
import type { TriageContext, TriageResult } from '#shared/triage/rules'
import { CONSTIPATION_LEVELS, diaryEntrySchema, emptyDiaryEntry } from '#shared/diary/schemas'
import type { DiaryEntryInput } from '#shared/diary/schemas'

/*
 * Property-based tests of the triage engine (issue 9: safe by construction, not by
 * enumeration). fast-check generates thousands of valid diary entries and contexts; each
 * property states what must hold for every one of them. A failure prints the smallest
 * entry fast-check can shrink it to.
 */

const RUNS = 3000
const SUBMITTED_AT = new Date('2025-03-12T15:00:00Z')

// --- Arbitraries -----------------------------------------------------------------------

/** A yes now and then (a yes half the time would make nearly every entry an emergency). */
const rarely = (oneIn: number) => fc.integer({ min: 1, max: oneIn }).map(n => n === 1)
const yesNo = rarely(6)

const tenths = (min: number, max: number) => fc.integer({ min: Math.round(min * 10), max: Math.round(max * 10) }).map(n => n / 10)

const glucoseArb = fc.oneof(
  fc.record({ unit: fc.constant('mg/dL' as const), value: fc.integer({ min: 20, max: 600 }) }),
  fc.record({ unit: fc.constant('mmol/L' as const), value: tenths(1.1, 33.3) }),
)
const temperatureArb = fc.oneof(
  fc.record({ unit: fc.constant('°C' as const), value: tenths(34, 43) }),
  fc.record({ unit: fc.constant('°F' as const), value: tenths(93.2, 109.4) }),
)
const ipssArb = fc.record({
  items: fc.array(fc.integer({ min: 0, max: 5 }), { minLength: 7, maxLength: 7 }),
  qualityOfLife: fc.integer({ min: 0, max: 6 }),
})

/** An optional field: absent (the key left out) about half the time. */
function withOptional<T extends object, K extends string, V>(base: fc.Arbitrary<T>, key: K, value: fc.Arbitrary<V>): fc.Arbitrary<T & { [P in K]?: V }> {
  return fc.tuple(base, fc.option(value, { nil: undefined })).map(([object, optional]) =>
    (optional === undefined ? object : { ...object, [key]: optional }) as T & { [P in K]?: V })
}

const rightNowArb = fc.record(Object.fromEntries(RIGHT_NOW_ITEMS.map(item => [item, rarely(40)])) as Record<(typeof RIGHT_NOW_ITEMS)[number], fc.Arbitrary<boolean>>)

const entryArb: fc.Arbitrary<DiaryEntryInput> = withOptional(fc.record({
  rightNow: rightNowArb,
  hotFlushes: fc.record({
    perDay: fc.integer({ min: 0, max: 50 }),
    worstSeverity: fc.constantFrom(...HOT_FLUSH_SEVERITIES),
    interference: fc.constantFrom(...HOT_FLUSH_INTERFERENCE),
  }),
  pain: fc.record({
    worst: fc.integer({ min: 0, max: 10 }),
    locations: fc.subarray([...PAIN_LOCATIONS]),
    newOrWorse: yesNo,
    wakesAtNight: yesNo,
    worseOnStraining: yesNo,
    bandLike: yesNo,
    tinglingOrNumbness: yesNo,
  }),
  urinary: withOptional(fc.record({ weakStreamOrStraining: yesNo, blood: yesNo, burning: yesNo }), 'ipss', ipssArb),
  heart: fc.record({
    fainting: yesNo,
    racingOrIrregular: yesNo,
    legSwelling: yesNo,
    breathlessLightEffort: yesNo,
    oneLegPainfulSwollen: yesNo,
  }),
  sugar: withOptional(fc.record({
    veryThirsty: yesNo,
    urinatingMore: yesNo,
    blurredVision: yesNo,
    lowSugarSigns: yesNo,
    neededHelpForLowSugar: yesNo,
  }), 'glucose', glucoseArb),
  infection: withOptional(fc.record({ any: yesNo, shakingChills: yesNo, feelsUnwell: yesNo }), 'temperature', temperatureArb),
  bowel: fc.record({
    any: yesNo,
    extraStoolsPerDay: fc.integer({ min: 0, max: 30 }),
    constipation: fc.constantFrom(...CONSTIPATION_LEVELS),
    bloodOrBlackStool: yesNo,
    vomiting: yesNo,
  }),
  falls: fc.record({ any: yesNo, hitHeadOrHurt: yesNo, cannotBearWeight: yesNo }),
  allergy: fc.record({ any: yesNo, spreading: yesNo }),
  mind: fc.record({ any: yesNo, confusedOrHardToWake: yesNo, memoryOrConcentration: yesNo }),
  headache: fc.record({ any: yesNo, suddenSevere: yesNo, visionOrVomiting: yesNo }),
  mood: fc.record({ phq2Interest: fc.integer({ min: 0, max: 3 }), phq2Down: fc.integer({ min: 0, max: 3 }) }),
  fatigue: fc.constantFrom(...FATIGUE_LEVELS),
  injectionSite: fc.record({ pain: yesNo, redness: yesNo, swelling: yesNo, lump: yesNo, feverOrSpreadingRednessOrPus: yesNo }),
}), 'note', fc.string({ maxLength: 30 }))

/** The areas a diary before rules version 3 did not ask: an old stored entry lacks them. */
const V3_SECTIONS = ['infection', 'bowel', 'falls', 'allergy', 'mind', 'headache'] as const

/** A previous entry, sometimes stored by the older diary (without the version 3 areas). */
const previousEntryArb: fc.Arbitrary<DiaryEntryInput> = fc.tuple(entryArb, rarely(3)).map(([entry, old]) => {
  if (!old) return entry
  const stored = Object.fromEntries(Object.entries(structuredClone(entry))
    .filter(([section]) => !(V3_SECTIONS as readonly string[]).includes(section))) as Partial<DiaryEntryInput>
  const heart = stored.heart as Partial<DiaryEntryInput['heart']>
  delete heart.oneLegPainfulSwollen
  const sugar = stored.sugar as Partial<DiaryEntryInput['sugar']>
  delete sugar.lowSugarSigns
  delete sugar.neededHelpForLowSugar
  return stored as DiaryEntryInput
})

const riskProfileArb: fc.Arbitrary<RiskProfile> = fc.record(
  Object.fromEntries(RISK_FACTORS.map(factor => [factor, rarely(5)])) as Record<RiskFactor, fc.Arbitrary<boolean>>)

const contextArb: fc.Arbitrary<TriageContext> = fc.record({
  flareWatchActive: rarely(4),
  baseline: fc.array(previousEntryArb, { maxLength: 3 }),
  riskProfile: fc.option(riskProfileArb, { nil: undefined }),
}).map(({ riskProfile, ...rest }) => ({ ...rest, submittedAt: SUBMITTED_AT, ...(riskProfile ? { riskProfile } : {}) }))

// --- Worse answers -----------------------------------------------------------------------

type Path = readonly (string | number)[]

function getAt(root: unknown, path: Path): unknown {
  return path.reduce<unknown>((node, key) => (node as Record<string | number, unknown>)[key], root)
}

function setAt<T>(root: T, path: Path, value: unknown): T {
  const copy = structuredClone(root)
  const parent = getAt(copy, path.slice(0, -1)) as Record<string | number, unknown>
  parent[path[path.length - 1]!] = value
  return copy
}

/** Every yes-or-no answer of the diary, from a fresh entry. */
const BOOLEAN_PATHS: Path[] = Object.entries(emptyDiaryEntry()).flatMap(([section, answers]) =>
  answers && typeof answers === 'object' && !Array.isArray(answers)
    ? Object.entries(answers).filter(([, value]) => typeof value === 'boolean').map(([key]) => [section, key])
    : [])

/** Whole-number answers where a higher number is a worse answer, with their largest value. */
const NUMBER_PATHS: [Path, number][] = [
  [['pain', 'worst'], 10],
  [['hotFlushes', 'perDay'], 50],
  [['bowel', 'extraStoolsPerDay'], 30],
  [['mood', 'phq2Interest'], 3],
  [['mood', 'phq2Down'], 3],
  ...Array.from({ length: 7 }, (_, item) => [['urinary', 'ipss', 'items', item], 5] as [Path, number]),
]

/** Choices where a later option is a worse answer. */
const CHOICE_PATHS: [Path, readonly string[]][] = [
  [['hotFlushes', 'worstSeverity'], HOT_FLUSH_SEVERITIES],
  [['hotFlushes', 'interference'], HOT_FLUSH_INTERFERENCE],
  [['fatigue'], FATIGUE_LEVELS],
  [['bowel', 'constipation'], CONSTIPATION_LEVELS],
]

/** An entry with the month's IPSS answered (all zero if it was not), so its items can rise. */
function withIpss(entry: DiaryEntryInput): DiaryEntryInput {
  if (entry.urinary.ipss) return entry
  return setAt(entry, ['urinary', 'ipss'], { items: [0, 0, 0, 0, 0, 0, 0], qualityOfLife: 0 })
}

/** One answer made worse, or the entry unchanged when that answer is already at its worst. */
type Worsening = (entry: DiaryEntryInput) => DiaryEntryInput

const worseningArb: fc.Arbitrary<Worsening> = fc.oneof(
  fc.constantFrom(...BOOLEAN_PATHS).map(path => (entry: DiaryEntryInput) => setAt(entry, path, true)),
  fc.tuple(fc.constantFrom(...NUMBER_PATHS), fc.nat()).map(([[path, max], step]) => (entry: DiaryEntryInput) => {
    const start = path[1] === 'ipss' ? withIpss(entry) : entry
    const now = getAt(start, path) as number
    return now >= max ? start : setAt(start, path, now + 1 + (step % (max - now)))
  }),
  fc.tuple(fc.constantFrom(...CHOICE_PATHS), fc.nat()).map(([[path, options], step]) => (entry: DiaryEntryInput) => {
    const now = options.indexOf(getAt(entry, path) as string)
    const last = options.length - 1
    return now >= last ? entry : setAt(entry, path, options[now + 1 + (step % (last - now))])
  }),
  fc.constantFrom(...PAIN_LOCATIONS).map(location => (entry: DiaryEntryInput) =>
    entry.pain.locations.includes(location) ? entry : setAt(entry, ['pain', 'locations'], [...entry.pain.locations, location])),
)

// --- Checks ------------------------------------------------------------------------------

const ruleIds = (result: TriageResult) => result.reasons.map(reason => reason.rule)

/** `after` is at least as high as `before` and keeps every one of its reasons. */
function expectNotLower(before: TriageResult, after: TriageResult): void {
  expect(compareLevels(after.level, before.level), `${before.level} -> ${after.level}`).toBeGreaterThanOrEqual(0)
  expect(ruleIds(after)).toEqual(expect.arrayContaining(ruleIds(before)))
}

const property = <T extends unknown[]>(arbs: { [K in keyof T]: fc.Arbitrary<T[K]> }, check: (...args: T) => void, numRuns = RUNS) =>
  // fc.property's overloads take the arbitraries one by one; spread them through one typed view.
  fc.assert((fc.property as (...args: unknown[]) => fc.IPropertyWithHooks<T>)(...arbs, check), { numRuns })

describe('the generated entries are valid diary entries', () => {
  it('every generated entry and previous entry parses with diaryEntrySchema (the old ones once laid over a fresh entry)', () => {
    property([entryArb, contextArb], (entry, context) => {
      expect(diaryEntrySchema.safeParse(entry).success).toBe(true)
      for (const previous of context.baseline) {
        const fresh = emptyDiaryEntry() as unknown as Record<string, object>
        const laid = Object.fromEntries(Object.entries(previous).map(([key, value]) =>
          [key, value && typeof value === 'object' && !Array.isArray(value) ? { ...fresh[key], ...value } : value]))
        expect(diaryEntrySchema.safeParse({ ...fresh, ...laid }).success).toBe(true)
      }
    }, 2000)
  })
})

describe('property 1: monotone — a worse answer never lowers the level or removes a reason', () => {
  it('a yes instead of a no', () => {
    property([entryArb, contextArb, fc.constantFrom(...BOOLEAN_PATHS)], (entry, context, path) => {
      expectNotLower(evaluateTriage(entry, context), evaluateTriage(setAt(entry, path, true), context))
    })
  })

  it('a higher number (pain, hot flushes a day, extra stools, PHQ-2 items, IPSS items)', () => {
    property([entryArb, contextArb, fc.constantFrom(...NUMBER_PATHS), fc.nat()], (entry, context, [path, max], step) => {
      const before = path[1] === 'ipss' ? withIpss(entry) : entry
      const now = getAt(before, path) as number
      fc.pre(now < max)
      const after = setAt(before, path, now + 1 + (step % (max - now)))
      expectNotLower(evaluateTriage(before, context), evaluateTriage(after, context))
    })
  })

  it('a worse choice (hot-flush severity and interference, fatigue, constipation)', () => {
    property([entryArb, contextArb, fc.constantFrom(...CHOICE_PATHS), fc.nat()], (entry, context, [path, options], step) => {
      const now = options.indexOf(getAt(entry, path) as string)
      fc.pre(now < options.length - 1)
      const after = setAt(entry, path, options[now + 1 + (step % (options.length - 1 - now))])
      expectNotLower(evaluateTriage(entry, context), evaluateTriage(after, context))
    })
  })

  it('one more pain location', () => {
    property([entryArb, contextArb, fc.constantFrom(...PAIN_LOCATIONS)], (entry, context, location) => {
      fc.pre(!entry.pain.locations.includes(location))
      const after = setAt(entry, ['pain', 'locations'], [...entry.pain.locations, location])
      expectNotLower(evaluateTriage(entry, context), evaluateTriage(after, context))
    })
  })

  it('a higher temperature above 37 °C, a lower one below 37 °C, and adding a reading at all', () => {
    const celsiusPair = fc.tuple(tenths(34, 43), tenths(34, 43)).map(([a, b]) => {
      const [low, high] = a <= b ? [a, b] : [b, a]
      // Away from 37: above it the higher reading is worse, below it the lower one.
      return low >= 37 ? { better: low, worse: high } : high <= 37 ? { better: high, worse: low } : null
    })
    property([entryArb, contextArb, celsiusPair, fc.boolean()], (entry, context, pair, fahrenheit) => {
      fc.pre(pair !== null)
      const reading = (celsius: number) => fahrenheit
        ? { unit: '°F' as const, value: Math.round((celsius * 9 / 5 + 32) * 10) / 10 }
        : { unit: '°C' as const, value: celsius }
      const withoutReading = { ...entry, infection: { ...entry.infection } }
      delete withoutReading.infection.temperature
      const better = setAt(withoutReading, ['infection', 'temperature'], reading(pair!.better))
      const worse = setAt(withoutReading, ['infection', 'temperature'], reading(pair!.worse))
      expectNotLower(evaluateTriage(withoutReading, context), evaluateTriage(better, context))
      expectNotLower(evaluateTriage(better, context), evaluateTriage(worse, context))
    })
  })

  it('glucose: a lower reading below 100 mg/dL (5.55 mmol/L), a higher one above, and adding a reading never lower the level', () => {
    // Both readings in the same unit, on the same side of 100 mg/dL; mmol/L to one decimal.
    const pairIn = (unit: 'mg/dL' | 'mmol/L') => {
      const value = unit === 'mg/dL' ? fc.integer({ min: 20, max: 600 }) : tenths(1.1, 33.3)
      const normal = unit === 'mg/dL' ? 100 : 100 / 18.016
      return fc.tuple(value, value).map(([a, b]) => {
        const [low, high] = a <= b ? [a, b] : [b, a]
        const pair = low >= normal ? { better: low, worse: high } : high <= normal ? { better: high, worse: low } : null
        return pair && { unit, ...pair }
      })
    }
    property([entryArb, contextArb, fc.oneof(pairIn('mg/dL'), pairIn('mmol/L'))], (entry, context, pair) => {
      fc.pre(pair !== null)
      const withoutReading = { ...entry, sugar: { ...entry.sugar } }
      delete withoutReading.sugar.glucose
      const better = setAt(withoutReading, ['sugar', 'glucose'], { unit: pair!.unit, value: pair!.better })
      const worse = setAt(withoutReading, ['sugar', 'glucose'], { unit: pair!.unit, value: pair!.worse })
      expectNotLower(evaluateTriage(withoutReading, context), evaluateTriage(better, context))
      expectNotLower(evaluateTriage(better, context), evaluateTriage(worse, context))
    })
  })

  it('the flare watch on', () => {
    property([entryArb, contextArb], (entry, context) => {
      expectNotLower(evaluateTriage(entry, { ...context, flareWatchActive: false }), evaluateTriage(entry, { ...context, flareWatchActive: true }))
    })
  })

  it('a risk factor on (and a profile at all, against none)', () => {
    property([entryArb, contextArb, fc.constantFrom(...RISK_FACTORS)], (entry, context, factor) => {
      const profile = context.riskProfile ?? emptyRiskProfile()
      const without = { ...context, riskProfile: { ...profile, [factor]: false } }
      const withFactor = { ...context, riskProfile: { ...profile, [factor]: true } }
      const noProfile = { ...context }
      delete noProfile.riskProfile
      expectNotLower(evaluateTriage(entry, noProfile), evaluateTriage(entry, without))
      expectNotLower(evaluateTriage(entry, without), evaluateTriage(entry, withFactor))
    })
  })

  /*
   * The baseline. "A worse baseline" cannot mean a worse earlier report: a symptom that
   * was already as bad last week has not worsened, so the Basch rule rightly does not
   * fire (REFERENCES.md: worse by 2 or more since the last report). It is read as:
   * (a) the baseline can only ever add to the level the entry reaches with no baseline
   *     (a worsening raise adds a reason, it never takes one away), and
   * (b) a better earlier report never lowers the level (the same entry after a better
   *     week is at least as concerning as after a worse one).
   */
  it('(a) any baseline only adds to the level the entry reaches with none', () => {
    property([entryArb, contextArb], (entry, context) => {
      expectNotLower(evaluateTriage(entry, { ...context, baseline: [] }), evaluateTriage(entry, context))
    })
  })

  it('(b) a better earlier report never lowers the level', () => {
    property([entryArb, contextArb, entryArb.map(withIpss), worseningArb], (entry, context, lastReport, worsen) => {
      // The last report has its IPSS answered, so that "worse" changes an answer and never
      // only adds the monthly IPSS (which would make a different report the IPSS baseline).
      const worseLastReport = worsen(lastReport)
      const afterWorseWeek = evaluateTriage(entry, { ...context, baseline: [worseLastReport, ...context.baseline] })
      const afterBetterWeek = evaluateTriage(entry, { ...context, baseline: [lastReport, ...context.baseline] })
      expectNotLower(afterWorseWeek, afterBetterWeek)
    })
  })

  it('any worse answer, with any context (the mixed property)', () => {
    property([entryArb, contextArb, worseningArb], (entry, context, worsen) => {
      expectNotLower(evaluateTriage(entry, context), evaluateTriage(worsen(entry), context))
    })
  })
})

// --- Property 2: coverage ----------------------------------------------------------------

interface Leaf {
  path: string[]
  schema: z.ZodTypeAny
}

type Def = { typeName: string, [key: string]: unknown }
const defOf = (schema: z.ZodTypeAny) => schema._def as Def

/** Every answer the diary asks: the leaves of the schema (a reading or a list counts as one answer). */
function leavesOf(schema: z.ZodTypeAny, path: string[] = []): Leaf[] {
  const def = defOf(schema)
  if (def.typeName === 'ZodObject') {
    return Object.entries((schema as z.AnyZodObject).shape).flatMap(([key, child]) => leavesOf(child as z.ZodTypeAny, [...path, key]))
  }
  if (def.typeName === 'ZodOptional') {
    const inner = (schema as z.ZodOptional<z.ZodTypeAny>).unwrap()
    return defOf(inner).typeName === 'ZodObject' ? leavesOf(inner, path) : [{ path, schema: inner }]
  }
  return [{ path, schema }]
}

/** The least answer: no, the smallest number, the first choice, an empty list (the schema's own bounds). */
function leastValue(schema: z.ZodTypeAny): unknown {
  const def = defOf(schema)
  switch (def.typeName) {
    case 'ZodBoolean': return false
    case 'ZodNumber': return (schema as z.ZodNumber).minValue
    case 'ZodEnum': return (schema as z.ZodEnum<[string, ...string[]]>).options[0]
    case 'ZodObject': return Object.fromEntries(Object.entries((schema as z.AnyZodObject).shape).map(([key, child]) => [key, leastValue(child as z.ZodTypeAny)]))
    case 'ZodArray': {
      const length = (def.exactLength as { value: number } | null)?.value ?? 0
      return Array.from({ length }, () => leastValue((schema as z.ZodArray<z.ZodTypeAny>).element))
    }
    default: throw new Error(`No least value for ${def.typeName}`)
  }
}

/** The worst answer: yes, the largest number, the last choice, every choice of a list, the highest reading. */
function worstValue(schema: z.ZodTypeAny): unknown {
  const def = defOf(schema)
  switch (def.typeName) {
    case 'ZodBoolean': return true
    case 'ZodNumber': return (schema as z.ZodNumber).maxValue
    case 'ZodEnum': return (schema as z.ZodEnum<[string, ...string[]]>).options.at(-1)
    case 'ZodString': return 'Something I want the nurse to know.'
    case 'ZodEffects': return worstValue((schema as z.ZodEffects<z.ZodTypeAny>).innerType())
    case 'ZodArray': {
      const element = (schema as z.ZodArray<z.ZodTypeAny>).element
      if (defOf(element).typeName === 'ZodEnum') return [...(element as z.ZodEnum<[string, ...string[]]>).options]
      const length = (def.exactLength as { value: number } | null)?.value ?? 1
      return Array.from({ length }, () => worstValue(element))
    }
    case 'ZodDiscriminatedUnion': {
      const option = (def.options as z.AnyZodObject[])[0]!
      return Object.fromEntries(Object.entries(option.shape).map(([key, child]) => {
        const childDef = defOf(child as z.ZodTypeAny)
        return [key, childDef.typeName === 'ZodLiteral' ? childDef.value : worstValue(child as z.ZodTypeAny)]
      }))
    }
    default: throw new Error(`No worst value for ${def.typeName}`)
  }
}

/** An empty entry with one answer at its worst (an optional section such as the IPSS filled with least answers first). */
function entryWithWorst(leaf: Leaf): DiaryEntryInput {
  const entry = emptyDiaryEntry() as unknown as Record<string, unknown>
  let node: Record<string, unknown> = entry
  let schema = diaryEntrySchema as z.ZodTypeAny
  for (const key of leaf.path.slice(0, -1)) {
    schema = (schema as z.AnyZodObject).shape[key] as z.ZodTypeAny
    if (defOf(schema).typeName === 'ZodOptional') schema = (schema as z.ZodOptional<z.ZodTypeAny>).unwrap()
    if (node[key] === undefined) node[key] = leastValue(schema)
    node = node[key] as Record<string, unknown>
  }
  node[leaf.path.at(-1)!] = worstValue(leaf.schema)
  return entry as unknown as DiaryEntryInput
}

describe('property 2: coverage — every answer can raise the level alone, or says why not', () => {
  const leaves = leavesOf(diaryEntrySchema)
  const noContext: TriageContext = { flareWatchActive: false, baseline: [], submittedAt: SUBMITTED_AT }

  it('walks the whole diary (every section of a fresh entry has answers here)', () => {
    const sections = new Set(leaves.map(leaf => leaf.path[0]))
    for (const section of Object.keys(emptyDiaryEntry())) expect(sections, section).toContain(section)
    expect(leaves.length).toBeGreaterThan(60)
  })

  it.each(leavesOf(diaryEntrySchema).map(leaf => [leaf.path.join('.'), leaf] as const))('%s', (name, leaf) => {
    const entry = entryWithWorst(leaf)
    expect(diaryEntrySchema.safeParse(entry).success, `${name} set to its worst is a valid entry`).toBe(true)
    const level = evaluateTriage(entry, noContext).level
    const listed = ANSWERS_NOT_RAISING_ALONE[name]
    if (listed === undefined) {
      expect(level, `${name} at its worst raises nothing and is not in ANSWERS_NOT_RAISING_ALONE`).not.toBe('none')
    }
    else {
      expect(level, `${name} is listed as not raising alone, but it does`).toBe('none')
      expect(listed.length).toBeGreaterThan(20)
    }
  })

  it('the table names only answers the diary asks', () => {
    const names = leaves.map(leaf => leaf.path.join('.'))
    for (const name of Object.keys(ANSWERS_NOT_RAISING_ALONE)) expect(names).toContain(name)
  })
})

// --- Property 3: the right-now check alone -------------------------------------------------

describe('property 3: the right-now check alone always gives emergency, whatever the context', () => {
  it('any single right-now yes, everything else empty', () => {
    property([fc.constantFrom(...RIGHT_NOW_ITEMS), contextArb], (item, context) => {
      const entry = setAt(emptyDiaryEntry(), ['rightNow', item], true)
      expect(evaluateTriage(entry, context).level).toBe('emergency')
      expect(rightNowTriggered(entry.rightNow).emergency).toBe(true)
    })
  })

  it('any right-now yes in any entry', () => {
    property([entryArb, contextArb, fc.constantFrom(...RIGHT_NOW_ITEMS)], (entry, context, item) => {
      expect(evaluateTriage(setAt(entry, ['rightNow', item], true), context).level).toBe(LEVELS.at(-1))
    })
  })
})
