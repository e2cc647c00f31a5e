import { describe, expect, it } from 'vitest'
import { restoreDiaryDraft } from '../../stores/diary-draft'

// A draft saved in the browser by an older page must come back as a whole draft the server's
// strict schema accepts, without turning an unanswered right-now question into a "no".
describe('restoreDiaryDraft: a saved draft laid over a fresh one', () => {
  it('keeps what he answered and fills in a section the older page did not have', () => {
    const restored = restoreDiaryDraft({
      hotFlushes: { perDay: 6, worstSeverity: 'moderate', interference: 'some' },
      pain: { worst: 4 },
    })
    expect(restored.hotFlushes).toEqual({ perDay: 6, worstSeverity: 'moderate', interference: 'some' })
    expect(restored.pain.worst).toBe(4)
    expect(restored.pain.locations).toEqual([])
    expect(restored.falls).toEqual({ any: false, hitHeadOrHurt: false, cannotBearWeight: false })
  })

  it('drops keys the diary no longer has, and a note that is not text', () => {
    const restored = restoreDiaryDraft({ retiredSection: { x: 1 }, note: 42 }) as unknown as Record<string, unknown>
    expect('retiredSection' in restored).toBe(false)
    expect(restored.note).not.toBe(42)
    expect((restoreDiaryDraft({ note: 'Tired on Tuesday' }) as unknown as { note: string }).note).toBe('Tired on Tuesday')
  })

  it('leaves a right-now question unanswered unless it was answered yes or no', () => {
    const restored = restoreDiaryDraft({ rightNow: { chestPain: true, seizure: false, newWeakness: 'yes' } })
    expect(restored.rightNow.chestPain).toBe(true)
    expect(restored.rightNow.seizure).toBe(false)
    expect(restored.rightNow.newWeakness).toBeNull()
    expect(restored.rightNow.troubleWalking).toBeNull()
  })

  it('gives a fresh draft for something that is not a draft', () => {
    for (const junk of [null, 'x', 3, []]) {
      const restored = restoreDiaryDraft(junk)
      expect(Object.values(restored.rightNow).every(v => v === null)).toBe(true)
    }
  })
})
