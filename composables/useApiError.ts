import { FetchError } from 'ofetch'

interface ApiErrorData { fieldErrors?: Record<string, string[]>, retryAfter?: number }

/**
 * Turns a failed $fetch into words in the user's language: the server sends locale keys
 * (errors.* for the whole request, validation.* per field).
 */
export function useApiError() {
  const { t, te } = useI18n()
  const translateKey = (key: string | undefined, fallback = 'errors.unexpected') =>
    key && te(key) ? t(key) : t(fallback)

  function describe(error: unknown): { message: string, fields: Record<string, string> } {
    if (error instanceof FetchError) {
      const body = error.data as { message?: string, statusMessage?: string, data?: ApiErrorData } | undefined
      if (!error.response) return { message: t('errors.network'), fields: {} }
      const fields = Object.fromEntries(
        Object.entries(body?.data?.fieldErrors ?? {}).map(([path, keys]) => [path, translateKey(keys[0], 'validation.generic.invalid')]),
      )
      const retryAfter = body?.data?.retryAfter
      const message = error.statusCode === 429 && retryAfter
        ? t('errors.tooManyAttemptsWait', { minutes: Math.max(1, Math.ceil(retryAfter / 60)) })
        : translateKey(body?.message)
      return { message, fields }
    }
    return { message: t('errors.unexpected'), fields: {} }
  }

  return { describe, translateKey }
}
