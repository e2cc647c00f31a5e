import { getResponseHeader, setResponseHeader } from 'h3'

/*
 * The security headers that depend on the public URL (NUXT_PUBLIC_URL, read when the server
 * starts, not when it is built) and the pages' caching. nuxt-security (nuxt.config.ts) sends
 * the rest; its HSTS is fixed at build time, so it is off there and sent here instead.
 *
 * - Public URL on https: Strict-Transport-Security on every response (pages, API, assets),
 *   and upgrade-insecure-requests in the pages' Content-Security-Policy. On plain http (a
 *   local network install, the tests) neither: a browser ignores HSTS over http, and
 *   upgrading would break every asset of an http-only server.
 * - Every server-rendered page: Cache-Control: no-store. Most pages carry a patient's data in
 *   the HTML and its payload; no-store also keeps them out of the back/forward cache, so
 *   after signing out on a shared computer Back does not show the diary again. The sign-in
 *   and forgot-password pages are no-store too: one rule for every page, and they are cheap
 *   to render.
 * - A page that answers with a redirect (a signed-out visitor sent to sign-in) has no HTML to
 *   put a nonce in, and nuxt-security leaves its placeholder in the policy: dropped here.
 */
const HSTS = 'max-age=31536000; includeSubDomains'

export default defineNitroPlugin((nitroApp) => {
  const https = new URL(useRuntimeConfig().publicUrl).protocol === 'https:'

  if (https) {
    // Called once at start-up by nuxt-security with its rules per route; its plugins run after ours.
    nitroApp.hooks.hook('nuxt-security:routeRules', (rules) => {
      const headers = rules['/**']?.headers
      const csp = headers ? headers.contentSecurityPolicy : undefined
      if (csp && typeof csp === 'object') csp['upgrade-insecure-requests'] = true
    })
    // First thing on every request, like a route rule's headers: error answers get it too.
    nitroApp.hooks.hook('request', (event) => {
      setResponseHeader(event, 'strict-transport-security', HSTS)
    })
  }

  nitroApp.hooks.hook('render:response', (response) => {
    response.headers = { ...response.headers, 'cache-control': 'no-store' }
  })

  nitroApp.hooks.hook('beforeResponse', (event) => {
    const policy = getResponseHeader(event, 'content-security-policy')
    if (typeof policy === 'string' && policy.includes('{{nonce}}')) {
      setResponseHeader(event, 'content-security-policy', policy.replaceAll(" 'nonce-{{nonce}}'", ''))
    }
  })
})
