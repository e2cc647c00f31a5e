import { TRIAGE_RULES } from '#shared/triage/rules'
import type { DiaryEntryInput } from '#shared/diary/schemas'
import type { RightNowDraft } from '~~/stores/diary-draft'

/**
 * The locale keys of what to do now for the right-now answers given (an unanswered one counts
 * as no), from the triage rules themselves: the diary's emergency screen and the one shown
 * before a message is sent say the same. The right-now rules read only the right-now answers.
 */
export function rightNowInstructionKeys(rightNow: RightNowDraft): string[] {
  const entry = { rightNow } as unknown as DiaryEntryInput
  return TRIAGE_RULES
    .filter(rule => rule.id.startsWith('right-now-') && rule.test(entry, { flareWatchActive: false, baseline: null }))
    .map(rule => rule.instructionKey)
}
