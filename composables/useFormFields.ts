import type { Ref } from 'vue'

/** The part of a useZodForm form that binds its fields. */
interface BindableForm {
  defineField: (path: never) => [Ref<unknown>, Ref<object>]
  errorText: (path: string) => string | undefined
}

/**
 * Binds a form's fields to FormTextField / FormTextArea by path: `bind('date')` is the value,
 * its update, vee-validate's listeners and the translated error, to spread into a field's
 * props (FormTextFields takes a list of them). Each path is defined once and kept.
 */
export function useFormFields(form: BindableForm) {
  const defined = new Map<string, [Ref<unknown>, Ref<object>]>()
  function bind(path: string) {
    let pair = defined.get(path)
    if (!pair) {
      pair = form.defineField(path as never)
      defined.set(path, pair)
    }
    const [model, attrs] = pair
    return {
      ...attrs.value,
      'modelValue': model.value as string | number | undefined,
      'onUpdate:modelValue': (value: unknown) => { model.value = value },
      'error': form.errorText(path),
    }
  }
  return { bind }
}
