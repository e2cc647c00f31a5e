import en from '../../../locales/en.json'
import es from '../../../locales/es.json'
import type { Language } from '#shared/auth/roles'

const MESSAGES: Record<Language, Record<string, unknown>> = { en, es }

/**
 * Server-side translation from the same locale files as the pages (e-mails, calendar
 * files). Placeholders are written {name}, as in vue-i18n.
 */
export function translate(language: Language, key: string, params: Record<string, string | number> = {}): string {
  const found = key.split('.').reduce<unknown>(
    (node, part) => (node && typeof node === 'object' ? (node as Record<string, unknown>)[part] : undefined),
    MESSAGES[language] ?? MESSAGES.en,
  )
  const template = typeof found === 'string' ? found : (language === 'en' ? key : translate('en', key, params))
  return template.replace(/\{(\w+)\}/g, (whole, name: string) => (name in params ? String(params[name]) : whole))
}
