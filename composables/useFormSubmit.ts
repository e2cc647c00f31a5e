import type { Ref } from 'vue'

/** The part of a useZodForm form that sends it. */
interface SendableForm<I> {
  isSubmitting: Ref<boolean>
  handleSubmit: (send: (input: I) => Promise<void>) => (event?: Event) => Promise<unknown>
  failure: Ref<string>
  showFailure: (error: unknown) => void
  setServerErrors: (fields: Record<string, string>) => void
}

/**
 * Sends a checked form: the last outcome goes, `send` runs, and the words it returns are shown
 * (a string) as saved (role status). A refusal is shown by `refusal`: 'fields-and-summary' (the server's
 * field messages at the fields and its summary above, useZodForm's showFailure),
 * 'fields-or-summary' (the summary only when no field is named) or 'summary' (only the summary).
 * `frame` is what FormCard and FormPage show of it: saving, saved, refused, and the submit.
 */
export function useFormSubmit<I>(
  form: SendableForm<I>,
  send: (input: I) => Promise<unknown>,
  refusal: 'fields-and-summary' | 'fields-or-summary' | 'summary' = 'fields-and-summary',
) {
  const { describe } = useApiError()
  const saved = ref('')
  function refuse(error: unknown) {
    if (refusal === 'fields-and-summary') return form.showFailure(error)
    const { message, fields } = describe(error)
    if (refusal === 'fields-or-summary' && Object.keys(fields).length) form.setServerErrors(fields)
    else form.failure.value = message
  }
  const submit = form.handleSubmit(async (input) => {
    saved.value = ''
    form.failure.value = ''
    try {
      const words = await send(input)
      saved.value = typeof words === 'string' ? words : ''
    }
    catch (error) {
      refuse(error)
    }
  })
  const frame = computed(() => ({ submitting: form.isSubmitting.value, saved: saved.value, failure: form.failure.value, onSubmit: submit }))
  return { submit, saved, frame }
}
