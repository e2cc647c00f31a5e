import { toTypedSchema } from '@vee-validate/zod'
import { useForm } from 'vee-validate'
import type { ZodTypeAny, z } from 'zod'

/**
 * vee-validate form from the same zod schema the server uses; error messages are locale
 * keys, translated here. Server field errors (400/409) can be shown with setServerErrors.
 */
export function useZodForm<T extends ZodTypeAny>(schema: T, initialValues?: Partial<z.input<T>>) {
  const { t, te } = useI18n()
  const form = useForm({ validationSchema: toTypedSchema(schema), initialValues: initialValues as never })
  const errorText = (path: string) => {
    const key = (form.errors.value as Record<string, string | undefined>)[path]
    return key ? (te(key) ? t(key) : key) : undefined
  }
  function setServerErrors(fields: Record<string, string>) {
    for (const [path, message] of Object.entries(fields)) form.setFieldError(path as never, message)
  }
  return { ...form, errorText, setServerErrors }
}
