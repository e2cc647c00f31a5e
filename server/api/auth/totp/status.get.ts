import type { TotpStatus } from '#shared/auth/totp'
import { User } from '../../../db/models'

/** Where the user stands with the second factor: half signed in (what comes next) or signed in. */
export default defineEventHandler(async (event): Promise<TotpStatus> => {
  setResponseHeader(event, 'Cache-Control', 'no-store')
  const session = await getUserSession(event)
  if (!session.user) {
    const user = await requirePendingUser(event)
    return { signedIn: false, stage: secondFactorStage(user), enabled: Boolean(user.totpEnabledAt), required: secondFactorRequired(user.role), recoveryCodesLeft: null }
  }
  const signedIn = await requireActiveUser(event)
  const user = await User.findByPk(signedIn.id)
  const enabled = Boolean(user?.totpEnabledAt && user.totpSecret)
  return { signedIn: true, stage: null, enabled, required: secondFactorRequired(signedIn.role), recoveryCodesLeft: enabled ? await recoveryCodesLeft(signedIn.id) : null }
})
