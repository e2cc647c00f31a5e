import { z } from 'zod'
import { safeText } from '../common/text'

/** A code from the authenticator app: six digits (spaces typed between them are dropped). */
export const totpCodeSchema = z.string({ required_error: 'validation.code.required' })
  .transform(value => value.replace(/\s/g, ''))
  .pipe(z.string().regex(/^\d{6}$/, 'validation.code.invalid'))

/** POST /api/auth/totp/confirm and /disable: a code from the app. */
export const totpConfirmSchema = z.object({ code: totpCodeSchema }).strict()

/** POST /api/auth/totp/verify: a code from the app, or one recovery code instead. */
export const totpVerifySchema = z.union([
  z.object({ code: totpCodeSchema }).strict(),
  z.object({ recoveryCode: safeText().trim().min(10, 'validation.recoveryCode.invalid').max(20, 'validation.recoveryCode.invalid') }).strict(),
])

/** GET /api/auth/totp/status. */
export interface TotpStatus {
  /** False while half signed in (the password was right, the code is still to come). */
  signedIn: boolean
  /** What the half-signed-in user does next; null when signed in. */
  stage: 'enrol' | 'verify' | null
  enabled: boolean
  required: boolean
  recoveryCodesLeft: number | null
}

/** POST /api/auth/totp/enrol: shown until a code confirms it, never after. */
export interface TotpEnrolment {
  secret: string
  uri: string
  /** The QR code of uri, an SVG data URL made on the server. */
  qr: string
}
