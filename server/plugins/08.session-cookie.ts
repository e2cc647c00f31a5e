/*
 * The session cookie is Secure exactly when NUXT_PUBLIC_URL is https, decided when the
 * server starts, so one build serves both an https site and a plain-http install on a local
 * network address (a browser drops a Secure cookie sent over http: every sign-in would seem
 * to fail). nuxt-auth-utils reads the cookie options from the request's copy of the runtime
 * config (Nitro makes one per request from the build's config and the environment; the
 * shared one is frozen), so the flag is set on that copy before any handler runs.
 */
export default defineNitroPlugin((nitroApp) => {
  const secure = new URL(useRuntimeConfig().publicUrl).protocol === 'https:'
  nitroApp.hooks.hook('request', (event) => {
    Object.assign(useRuntimeConfig(event).session.cookie, { secure })
  })
})
