// The two faces every page uses, asked for from the head of the page instead of after the
// stylesheet has been read: text swaps to Atkinson Hyperlegible sooner, so the header's
// line breaks (and all below it) move earlier, usually before the first paint.
import regular from '@fontsource/atkinson-hyperlegible/files/atkinson-hyperlegible-latin-400-normal.woff2?url'
import bold from '@fontsource/atkinson-hyperlegible/files/atkinson-hyperlegible-latin-700-normal.woff2?url'

export default defineNuxtPlugin(() => {
  useHead({
    link: [regular, bold].map(href => ({ rel: 'preload', as: 'font', type: 'font/woff2', href, crossorigin: 'anonymous' })),
  })
})
