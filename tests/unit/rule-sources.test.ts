import { describe, expect, it } from 'vitest'
import { LAB_RULES, LAB_SOURCES } from '#shared/labs/lab-triage'
import { RAISE_RULES, TRIAGE_RULES, TRIAGE_SOURCES } from '#shared/triage/rules'
import en from '../../locales/en.json'
import es from '../../locales/es.json'

// Issue 17: a rule's source is prose the nurse reads in her language. The English locale
// must hold each source exactly as the rules cite it (a rule's text changed without its
// locale entry would show the stale English citation), and Spanish must differ from it (a
// copy would mean it was never translated), unless the source is a bare citation.
const CITATION_ONLY = new Set(['ctcae'])

describe('rule sources in both languages', () => {
  const groups = [
    ['triage', TRIAGE_SOURCES, en.triage.ruleSources, es.triage.ruleSources],
    ['labs', LAB_SOURCES, en.labs.ruleSources, es.labs.ruleSources],
  ] as const

  for (const [name, sources, english, spanish] of groups) {
    it(`every ${name} source is in the English locale word for word, and translated in Spanish`, () => {
      for (const [key, text] of Object.entries(sources)) {
        expect((english as Record<string, string>)[key], key).toBe(text)
        expect((spanish as Record<string, string>)[key], key).toBeTruthy()
        if (!CITATION_ONLY.has(key)) expect((spanish as Record<string, string>)[key], key).not.toBe(text)
      }
      expect(Object.keys(english).sort()).toEqual(Object.keys(sources).sort())
    })
  }

  it('every rule cites one of those sources, so every reason can be shown in Spanish', () => {
    const known = new Set<string>([...Object.values(TRIAGE_SOURCES), ...Object.values(LAB_SOURCES)])
    const rules = [...TRIAGE_RULES, ...RAISE_RULES, ...LAB_RULES] as { id: string, source: string }[]
    expect(rules.length).toBeGreaterThan(40)
    expect(rules.filter(rule => !known.has(rule.source)).map(rule => rule.id)).toEqual([])
  })
})
