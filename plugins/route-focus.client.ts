// After a page change inside the app (not the first load), focus goes to the new page's main
// heading and its title is announced, so a screen-reader user hears where he is and a
// keyboard user starts from the top of the content instead of the page body. The diary's
// steps and result pages place focus themselves.
const SELF_FOCUSING = /^\/diary\/./

export default defineNuxtPlugin((nuxtApp) => {
  const router = useRouter()
  let pending = false
  router.afterEach((to, from, failure) => {
    pending = !failure && from.matched.length > 0 && to.path !== from.path && !to.hash && !SELF_FOCUSING.test(to.path)
  })

  let region: HTMLElement | null = null
  function announce(text: string) {
    if (!region) {
      region = document.createElement('div')
      region.setAttribute('aria-live', 'polite')
      region.setAttribute('role', 'status')
      region.className = 'sr-only'
      region.dataset.testid = 'route-announcer'
      document.body.appendChild(region)
    }
    region.textContent = ''
    // A fresh text node after clearing, so the same title twice is still read.
    setTimeout(() => { if (region) region.textContent = text }, 50)
  }

  nuxtApp.hook('page:finish', () => {
    if (!pending) return
    pending = false
    nextTick(() => {
      const heading = document.querySelector<HTMLElement>('main h1') ?? document.querySelector<HTMLElement>('main')
      if (!heading) return
      if (!heading.hasAttribute('tabindex')) heading.setAttribute('tabindex', '-1')
      heading.focus({ preventScroll: false })
      announce(heading.textContent?.trim() || document.title)
    })
  })
})
