import type { H3Event } from 'h3'
import { appendResponseHeader, getRequestHeader, getResponseHeader, setResponseHeader } from 'h3'
import { compress } from 'h3-compression'

/*
 * Pages and JSON made per request are gzip-compressed (h3-compression) when the browser
 * accepts it and the body is worth it. Nitro precompresses only the static assets
 * (compressPublicAssets): without this a phone on a slow line downloads Today's HTML and
 * the 92 kB of messages uncompressed (issue 10, a lean client).
 *
 * gzip, not brotli, for dynamic bodies: brotli's default level costs several milliseconds
 * of CPU per 100 kB on every request, gzip's level 6 a fraction of that for a similar gain
 * on text this size (common practice, not measured here).
 */
const MIN_BYTES = 1024
const COMPRESSIBLE = /^(?:text\/html|application\/json|text\/csv|text\/calendar)/

type Body = { body?: unknown }

/** The body as text when it is text or JSON worth compressing; undefined otherwise. */
function asText(event: H3Event, response: Body): string | undefined {
  const body = response.body
  if (typeof body === 'string') return COMPRESSIBLE.test(String(getResponseHeader(event, 'content-type') ?? '')) ? body : undefined
  // A route's returned object: serialised here once, as h3 would have done.
  if (body && typeof body === 'object' && !(body instanceof Error) && !(body instanceof Uint8Array)
    && (Array.isArray(body) || Object.getPrototypeOf(body) === Object.prototype)) {
    if (!getResponseHeader(event, 'content-type')) setResponseHeader(event, 'content-type', 'application/json')
    return COMPRESSIBLE.test(String(getResponseHeader(event, 'content-type'))) ? JSON.stringify(body) : undefined
  }
  return undefined
}

export default defineNitroPlugin((nitroApp) => {
  // Every response made by a handler: server-rendered pages, the API, the messages, the
  // calendar file and CSV exports. Static assets are served precompressed before this.
  nitroApp.hooks.hook('beforeResponse', async (event, response: Body) => {
    if (getResponseHeader(event, 'content-encoding') || event.handled) return
    const text = asText(event, response)
    if (text === undefined) return
    // Whatever the outcome, a cache between us and the browser must keep the two forms apart.
    if (!/accept-encoding/i.test(String(getResponseHeader(event, 'vary') ?? ''))) appendResponseHeader(event, 'vary', 'Accept-Encoding')
    response.body = text
    if (Buffer.byteLength(text) < MIN_BYTES || !/\bgzip\b/.test(getRequestHeader(event, 'accept-encoding') ?? '')) return
    await compress(event, response as Parameters<typeof compress>[1], 'gzip', { minSize: MIN_BYTES })
  })
})
