import { describe, expect, it } from 'vitest'
import { gtinCheckDigitValid, readKitLabel } from '#shared/visit/gs1'

// The carton label, checked against the GS1 General Specifications (GS1; section numbers
// from memory): the mod-10 check digit (7.9.1), AI 17 as YYMMDD with DD 00 the last day of
// the month (3.4.7), the century window of 7.12, FNC1 as the GS character and the
// symbology identifiers ]C1 (GS1-128), ]d2 (DataMatrix) and ]Q3 (QR).
const GS = String.fromCharCode(29)

describe('GTIN check digit (GS1 General Specifications 7.9.1)', () => {
  it('accepts the worked example and GTINs whose check digit is worked here by hand', () => {
    // The specification's worked example: GTIN-13 629104150021 + check digit 3.
    // From the right, 1 2 0 0 5 1 4 0 1 9 2 6 weighted 3,1,3,1...: 3+2+0+0+15+1+12+0+3+9+6+6 = 57; 60 - 57 = 3.
    expect(gtinCheckDigitValid('6291041500213')).toBe(true)
    // 0950600013435 weighted from the right: 15+3+12+3+3+0+0+0+18+0+15+9+0 = 78 -> 2.
    expect(gtinCheckDigitValid('09506000134352')).toBe(true)
    // GTIN-8 9638507: 7x3+0+5x3+8+3x3+6+9x3 = 21+0+15+8+9+6+27 = 86 -> 4.
    expect(gtinCheckDigitValid('96385074')).toBe(true)
  })

  it('refuses a wrong check digit, letters and other lengths', () => {
    expect(gtinCheckDigitValid('6291041500214')).toBe(false)
    expect(gtinCheckDigitValid('09506000134353')).toBe(false)
    expect(gtinCheckDigitValid('0950600013435A')).toBe(false)
    expect(gtinCheckDigitValid('123456789')).toBe(false)
  })
})

describe('reading a carton label', () => {
  const label = { gtin: '09506000134352', expiresOn: '2027-12-25', lot: 'ABC123' }

  it('reads the human-readable form with brackets', () => {
    expect(readKitLabel('(01)09506000134352(17)271225(10)ABC123')).toEqual({ ok: true, label })
  })

  it('reads the scanned form with or without a symbology identifier, the lot last or ended by GS', () => {
    expect(readKitLabel('01095060001343521727122510ABC123')).toEqual({ ok: true, label })
    expect(readKitLabel(']C101095060001343521727122510ABC123')).toEqual({ ok: true, label })
    expect(readKitLabel(']d201095060001343521727122510ABC123')).toEqual({ ok: true, label })
    expect(readKitLabel(`]Q30109506000134352` + `10ABC123${GS}17271225`)).toEqual({ ok: true, label })
  })

  it('takes DD 00 as the last day of the month, leap years included (3.4.7)', () => {
    expect(readKitLabel('01095060001343521728020010L1')).toMatchObject({ ok: true, label: { expiresOn: '2028-02-29' } })
    expect(readKitLabel('01095060001343521727020010L1')).toMatchObject({ ok: true, label: { expiresOn: '2027-02-28' } })
    expect(readKitLabel('01095060001343521727110010L1')).toMatchObject({ ok: true, label: { expiresOn: '2027-11-30' } })
  })

  it('puts a two-digit year within 49 years before and 50 after this year (7.12)', () => {
    const year = new Date().getFullYear()
    const yy = (n: number) => String(n % 100).padStart(2, '0')
    const read = (y: number) => readKitLabel(`0109506000134352` + `17${yy(y)}0101` + `10L1`)
    expect(read(year + 50)).toMatchObject({ ok: true, label: { expiresOn: `${year + 50}-01-01` } })
    expect(read(year - 49)).toMatchObject({ ok: true, label: { expiresOn: `${year - 49}-01-01` } })
  })

  it('says what is wrong with a label it cannot use', () => {
    expect(readKitLabel('hello')).toEqual({ ok: false, error: 'unreadable' })
    expect(readKitLabel('1727122510ABC123')).toEqual({ ok: false, error: 'noGtin' })
    expect(readKitLabel('01095060001343531727122510ABC123')).toEqual({ ok: false, error: 'checkDigit' })
    expect(readKitLabel('010950600013435210ABC123')).toEqual({ ok: false, error: 'noExpiry' })
    expect(readKitLabel('01095060001343521727133110ABC123')).toEqual({ ok: false, error: 'badExpiry' })
    expect(readKitLabel('01095060001343521727023010ABC123')).toEqual({ ok: false, error: 'badExpiry' })
    expect(readKitLabel('010950600013435217271225')).toEqual({ ok: false, error: 'noLot' })
  })
})
