/*
 * Nitro answers useRuntimeConfig(event) with a private copy per request: it deep-copies the
 * build's runtime config and looks up every key (about a hundred, most of them the i18n
 * module's) in the environment again, turning each name into NUXT_SNAKE_CASE. Every
 * internal fetch of a server render is a request of its own, and @nuxtjs/i18n,
 * nuxt-auth-utils and the renderer each ask for it: a CPU profile of Today's server render
 * at 10 connections put a quarter of the process's time there (issue 10).
 *
 * The environment is read once, at start (useRuntimeConfig() without an event is that
 * result), and Tidewell changes no setting while it runs, so every request gets a plain
 * copy of that instead: the same values, without a hundred environment look-ups. A copy,
 * not the object itself: the startup one is frozen, and @nuxtjs/i18n writes into its
 * request's copy while it sets up.
 */
/** A deep copy of plain JSON-like values (structuredClone costs several times more here). */
function copy<T>(value: T): T {
  if (Array.isArray(value)) return value.map(copy) as T
  if (value && typeof value === 'object') {
    const out: Record<string, unknown> = {}
    for (const key of Object.keys(value)) out[key] = copy((value as Record<string, unknown>)[key])
    return out as T
  }
  return value
}

export default defineNitroPlugin((nitroApp) => {
  const settled = copy(useRuntimeConfig())
  // The session cookie is Secure exactly when NUXT_PUBLIC_URL is https, decided here once, so
  // one build serves an https site and a plain-http install on a local network address (a
  // browser drops a Secure cookie sent over http: every sign-in would seem to fail).
  // nuxt-auth-utils reads the cookie options from the request's copy made below.
  Object.assign(settled.session.cookie, { secure: new URL(settled.publicUrl).protocol === 'https:' })
  const handler = nitroApp.h3App.handler
  nitroApp.h3App.handler = (event) => {
    const context = event.context as { nitro?: { errors: unknown[], runtimeConfig?: unknown } }
    context.nitro ??= { errors: [] }
    context.nitro.runtimeConfig ??= copy(settled)
    return handler(event)
  }
})
