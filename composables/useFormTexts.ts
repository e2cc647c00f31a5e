/** What a form frame (FormCard, FormPage, AuthPage) may be told in words, by key or as text. */
export interface FormTextsProps {
  /** The locale key the form's words sit under. */
  texts?: string
  heading?: string
  title?: string
  intro?: string
  submitLabel?: string
}

/**
 * A form frame's words. Each form keeps its words in the locale under one key, `texts`:
 * `<texts>.heading` (a card) or `<texts>.title` (a page), `<texts>.intro` where the locale has
 * one, and `<texts>.submit`. A heading, title, intro or submit label the caller gives wins,
 * for words that change with the form's state.
 */
export function useFormTexts(props: FormTextsProps, titleKey: 'heading' | 'title') {
  const { t, te } = useI18n()
  return computed(() => {
    const key = (name: string) => `${props.texts}.${name}`
    return {
      title: props[titleKey] || (props.texts ? t(key(titleKey)) : ''),
      intro: props.intro || (props.texts && te(key('intro')) ? t(key('intro')) : ''),
      submit: props.submitLabel || (props.texts ? t(key('submit')) : ''),
    }
  })
}
