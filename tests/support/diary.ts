import type { DiaryEntryInput } from '#shared/diary/schemas'
import { diaryEntryWith } from '#shared/diary/schemas'

/** A diary entry with every answer "no" or zero, changed where the test says. */
export function diaryEntry(changes: Parameters<typeof diaryEntryWith>[0] = {}): DiaryEntryInput {
  return diaryEntryWith(changes)
}
