import { COMBINATION_VIGNETTES, CONTROLS } from './combinations'
import { FLARE_VIGNETTES, RISK_VIGNETTES, WORSENING_VIGNETTES } from './context'
import { OTHER_VIGNETTES } from './other-areas'
import { PAIN_VIGNETTES } from './pain'
import { RIGHT_NOW_VIGNETTES } from './right-now'
import { BOWEL_VIGNETTES, INFECTION_VIGNETTES, SUGAR_VIGNETTES } from './sugar-infection-bowel'
import { HEART_VIGNETTES, URINARY_VIGNETTES } from './urinary-heart'
import type { Vignette } from './vignette'

export { CONTROLS }
export * from './vignette'

/** Every vignette, grouped by the area it is mainly about. */
export const VIGNETTE_GROUPS: Record<string, Vignette[]> = {
  'right-now check': RIGHT_NOW_VIGNETTES,
  'pain': PAIN_VIGNETTES,
  'urinary': URINARY_VIGNETTES,
  'heart and circulation': HEART_VIGNETTES,
  'blood sugar': SUGAR_VIGNETTES,
  'infection and fever': INFECTION_VIGNETTES,
  'bowels': BOWEL_VIGNETTES,
  'falls, rash, mind, headache, mood, fatigue, injection site, hot flushes, notes': OTHER_VIGNETTES,
  'flare watch': FLARE_VIGNETTES,
  'risk profile': RISK_VIGNETTES,
  'worse than his last report': WORSENING_VIGNETTES,
  'combinations': COMBINATION_VIGNETTES,
}

export const VIGNETTES: Vignette[] = Object.values(VIGNETTE_GROUPS).flat()
