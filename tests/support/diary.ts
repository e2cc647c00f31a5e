import type { DiaryEntryInput } from '../../shared/schemas/diary'
import { diaryEntryWith } from '../../shared/schemas/diary'

/** A diary entry with every answer "no" or zero, changed where the test says. */
export function diaryEntry(changes: Parameters<typeof diaryEntryWith>[0] = {}): DiaryEntryInput {
  return diaryEntryWith(changes)
}
