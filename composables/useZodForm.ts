import { toTypedSchema } from '@vee-validate/zod'
import { useForm } from 'vee-validate'
import type { ZodTypeAny, z } from 'zod'

/**
 * vee-validate form from the same zod schema the server uses; error messages are locale
 * keys, translated here. A refusal from the server goes through showFailure: its field
 * messages at the fields (400/409), its summary in `failure` above the form.
 */
export function useZodForm<T extends ZodTypeAny>(schema: T, initialValues?: Partial<z.input<T>>) {
  const { t, te } = useI18n()
  const { describe } = useApiError()
  const form = useForm({ validationSchema: toTypedSchema(schema), initialValues: initialValues as never })
  const failure = ref('')
  const errorText = (path: string) => {
    const key = (form.errors.value as Record<string, string | undefined>)[path]
    return key ? (te(key) ? t(key) : key) : undefined
  }
  function setServerErrors(fields: Record<string, string>) {
    for (const [path, message] of Object.entries(fields)) form.setFieldError(path as never, message)
  }
  function showFailure(error: unknown) {
    const { message, fields } = describe(error)
    setServerErrors(fields)
    failure.value = message
  }
  return { ...form, errorText, setServerErrors, failure, showFailure }
}
