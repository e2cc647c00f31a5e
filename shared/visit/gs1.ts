import { parseBarcode } from 'gs1-barcode-parser-mod'

/*
 * The carton's GS1 barcode, as a handheld scanner types it into a field: the product's GTIN
 * (AI 01), the expiry date (AI 17, YYMMDD) and the lot (AI 10). The package
 * gs1-barcode-parser-mod splits the element string (GS1-128, DataMatrix or QR with their
 * symbology identifier, or the human-readable form with brackets; FNC1 typed as the GS
 * character, ASCII 29) and applies the century rule. Tidewell adds what the package does not
 * check: the GTIN's check digit and that the date is a real one.
 *
 * Source: GS1 General Specifications (GS1, release 24; from memory for section numbers):
 * AI 01 is 14 digits with a mod-10 check digit (7.9.1); AI 17 is YYMMDD, and DD "00" means
 * the last day of that month (3.4.7); the century of YY is the one that puts the year within
 * 49 years before or 50 after the current year (7.12); AI 10 is up to 20 characters.
 */

export interface KitLabel {
  gtin: string
  /** The last day the kit may be used, YYYY-MM-DD. */
  expiresOn: string
  lot: string
}

export const KIT_LABEL_ERRORS = ['unreadable', 'noGtin', 'checkDigit', 'noExpiry', 'badExpiry', 'noLot'] as const
export type KitLabelError = (typeof KIT_LABEL_ERRORS)[number]

export type KitLabelReading = { ok: true, label: KitLabel } | { ok: false, error: KitLabelError }

/** Whether a GTIN-8, -12, -13 or -14 carries the right check digit (GS1 mod 10). */
export function gtinCheckDigitValid(gtin: string): boolean {
  if (!/^(\d{8}|\d{12}|\d{13}|\d{14})$/.test(gtin)) return false
  const digits = [...gtin].map(Number)
  const check = digits.pop()!
  // From the right, the digits are weighted 3, 1, 3, 1...
  const sum = digits.reverse().reduce((total, digit, i) => total + digit * (i % 2 === 0 ? 3 : 1), 0)
  return (10 - (sum % 10)) % 10 === check
}

const pad = (n: number) => String(n).padStart(2, '0')

/** The expiry as YYYY-MM-DD, or null when YYMMDD is not a date (month 13, 30 February). */
function expiryOf(element: { data: unknown, raw?: string }): string | null {
  const raw = element.raw ?? ''
  if (!/^\d{6}$/.test(raw) || !(element.data instanceof Date)) return null
  const month = Number(raw.slice(2, 4))
  const day = Number(raw.slice(4, 6))
  const year = element.data.getFullYear()
  const lastDay = new Date(Date.UTC(year, month, 0)).getUTCDate()
  if (month < 1 || month > 12 || day > lastDay) return null
  return `${year}-${pad(month)}-${pad(day === 0 ? lastDay : day)}`
}

/** Reads a scanned carton label: its GTIN, expiry and lot, or what is wrong with it. */
export function readKitLabel(scanned: string): KitLabelReading {
  let items
  try {
    items = parseBarcode(scanned.trim()).parsedCodeItems
  }
  catch {
    return { ok: false, error: 'unreadable' }
  }
  const find = (ai: string) => items.find(item => item.ai === ai)
  const gtin = find('01')
  if (!gtin || typeof gtin.data !== 'string') return { ok: false, error: 'noGtin' }
  if (!gtinCheckDigitValid(gtin.data)) return { ok: false, error: 'checkDigit' }
  const expiry = find('17')
  if (!expiry) return { ok: false, error: 'noExpiry' }
  const expiresOn = expiryOf(expiry)
  if (!expiresOn) return { ok: false, error: 'badExpiry' }
  const lot = find('10')
  if (!lot || typeof lot.data !== 'string' || !lot.data.trim()) return { ok: false, error: 'noLot' }
  return { ok: true, label: { gtin: gtin.data, expiresOn, lot: lot.data.trim() } }
}
