// The parts of gs1-barcode-parser-mod (MIT) that Tidewell uses; the package ships no types.
declare module 'gs1-barcode-parser-mod' {
  export interface ParsedElement {
    ai: string
    dataTitle: string
    /** A Date (local midnight) for date AIs, a string for the others. */
    data: unknown
    /** The characters as scanned (YYMMDD for a date AI). */
    raw?: string
  }
  export function parseBarcode(barcode: string): { codeName: string, parsedCodeItems: ParsedElement[] }
}
