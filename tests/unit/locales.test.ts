import { describe, expect, it } from 'vitest'
import en from '../../locales/en.json'
import es from '../../locales/es.json'

function keys(node: unknown, prefix = ''): string[] {
  if (!node || typeof node !== 'object') return [prefix]
  return Object.entries(node).flatMap(([key, value]) => keys(value, prefix ? `${prefix}.${key}` : key))
}

function placeholders(text: string): string[] {
  return [...text.matchAll(/\{(\w+)\}/g)].map(m => m[1]!).sort()
}

describe('locale files', () => {
  it('English and Spanish have exactly the same keys', () => {
    const a = keys(en).sort()
    const b = keys(es).sort()
    expect(a.filter(k => !b.includes(k))).toEqual([])
    expect(b.filter(k => !a.includes(k))).toEqual([])
  })

  it('every string uses the same placeholders in both languages and none is empty', () => {
    const lookup = (root: unknown, key: string) => key.split('.').reduce<any>((n, p) => n?.[p], root) // eslint-disable-line @typescript-eslint/no-explicit-any
    for (const key of keys(en)) {
      const english = lookup(en, key)
      const spanish = lookup(es, key)
      expect(typeof english, key).toBe('string')
      expect(String(english).trim(), key).not.toBe('')
      expect(String(spanish).trim(), key).not.toBe('')
      expect(placeholders(spanish), key).toEqual(placeholders(english))
    }
  })

  it('keys are sorted, so merges stay readable', () => {
    const sorted = (node: unknown): boolean => !node || typeof node !== 'object'
      || (Object.keys(node).join() === Object.keys(node).sort().join() && Object.values(node).every(sorted))
    expect(sorted(en)).toBe(true)
    expect(sorted(es)).toBe(true)
  })
})
