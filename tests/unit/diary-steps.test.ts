import { describe, expect, it } from 'vitest'
import { DIARY_STEPS, REVIEW_STEP, diaryStepOfPath } from '../../composables/useDiarySteps'
import { diaryEntrySchema } from '#shared/diary/schemas'

describe('the diary steps', () => {
  it('ask every part of the diary entry exactly once, and the review last', () => {
    const asked = DIARY_STEPS.flatMap(step => step.sections as readonly string[])
    expect([...asked].sort()).toEqual(Object.keys(diaryEntrySchema.shape).sort())
    expect(new Set(asked).size).toBe(asked.length)
    expect(DIARY_STEPS[REVIEW_STEP]!.id).toBe('review')
  })

  it('send a message at a field back to the step that asks it', () => {
    const stepOf = (id: string) => DIARY_STEPS.findIndex(step => step.id === id)
    expect(diaryStepOfPath('rightNow.chestPain')).toBe(stepOf('rightNow'))
    expect(diaryStepOfPath('urinary.ipss.items[2]')).toBe(stepOf('urinary'))
    expect(diaryStepOfPath('heart.oneLegPainfulSwollen')).toBe(stepOf('heart'))
    expect(diaryStepOfPath('sugar.neededHelpForLowSugar')).toBe(stepOf('sugar'))
    for (const path of ['infection.temperature.value', 'bowel.extraStoolsPerDay', 'falls.any', 'allergy.spreading', 'mind.any', 'headache.suddenSevere']) {
      expect(diaryStepOfPath(path)).toBe(stepOf('otherChanges'))
    }
    expect(diaryStepOfPath('fatigue')).toBe(stepOf('moodFatigue'))
    expect(diaryStepOfPath('draftId')).toBe(-1)
  })
})
