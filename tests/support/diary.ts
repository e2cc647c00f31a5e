import type { DiaryEntryInput } from '../../shared/schemas/diary'
import { emptyDiaryEntry } from '../../shared/schemas/diary'

type DeepPartial<T> = { [K in keyof T]?: T[K] extends object ? (T[K] extends unknown[] ? T[K] : DeepPartial<T[K]>) : T[K] }

/** A diary entry with every answer "no" or zero, changed where the test says. */
export function diaryEntry(changes: DeepPartial<DiaryEntryInput> = {}): DiaryEntryInput {
  const base = emptyDiaryEntry() as unknown as Record<string, unknown>
  for (const [key, value] of Object.entries(changes)) {
    base[key] = value && typeof value === 'object' && !Array.isArray(value)
      ? { ...(base[key] as object), ...value }
      : value
  }
  return base as unknown as DiaryEntryInput
}
