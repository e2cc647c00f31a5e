const datetimeFormats = {
  short: { year: 'numeric', month: 'short', day: 'numeric' },
  long: { year: 'numeric', month: 'long', day: 'numeric' },
  weekday: { weekday: 'long', year: 'numeric', month: 'long', day: 'numeric' },
  time: { hour: 'numeric', minute: '2-digit' },
  dateTime: { year: 'numeric', month: 'short', day: 'numeric', hour: 'numeric', minute: '2-digit' },
} as const

export default defineI18nConfig(() => ({
  fallbackLocale: 'en',
  datetimeFormats: { 'en': datetimeFormats, 'es': datetimeFormats },
  numberFormats: {
    en: { decimal: { maximumFractionDigits: 1 } },
    es: { decimal: { maximumFractionDigits: 1 } },
  },
}))
