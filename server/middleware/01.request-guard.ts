import type { H3Event } from 'h3'
import { createError, defineEventHandler, getRequestHeader, getRequestURL } from 'h3'
import { ATTACHMENT_MAX_BYTES } from '#shared/attachments/rules'

/*
 * Every state-changing API request (POST, PUT, PATCH, DELETE under /api/) passes here
 * before any route reads it:
 *
 * - Cross-site requests are refused (403 errors.crossSite): the Origin header must be the
 *   public URL's origin (NUXT_PUBLIC_URL) or the request's own (the Host the browser sent
 *   to); a request without Origin must say `Sec-Fetch-Site: same-origin`. A browser sends
 *   Origin on every such request and a page on another site cannot forge it, so a form or
 *   script elsewhere cannot act with the user's cookie.
 * - A body must be JSON (415 errors.jsonOnly): an HTML form can send only form-encoded,
 *   multipart or text/plain bodies, never application/json.
 * - A body may be at most MAX_BODY_BYTES (413 errors.bodyTooLarge), judged by its
 *   Content-Length before a byte of it is read; a body without a length (chunked) answers
 *   411 errors.lengthRequired. Browsers and ofetch always send a length with JSON.
 *
 * One route takes something else on purpose: an attachment upload
 * (POST /api/patients/:id/attachments, UPLOAD_ROUTE) may be multipart/form-data of at most
 * ATTACHMENT_MAX_BYTES plus UPLOAD_OVERHEAD_BYTES for the multipart framing (413 past that);
 * anything else sent there is judged as everywhere (JSON, 64 kB), so a signed-out caller
 * still gets 401 from the route. Only that exact path; every other route stays JSON-only and
 * 64 kB, and the Origin check holds for the upload as for everything else.
 *
 * nuxt-auth-utils' own DELETE /api/_auth/session (useUserSession().clear()) carries no
 * body and the browser sends Origin with it, so it passes like any other request.
 */

const GUARDED_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])

/** The body limit of every route that does not name its own below. */
const MAX_BODY_BYTES = 64 * 1024

/**
 * Routes that need a larger body: path prefix -> bytes (the longest matching prefix wins).
 * Empty: every route fits in 64 kB. See DEVELOPERS.md "Request bodies".
 */
const LARGER_BODY_LIMITS: Record<string, number> = {}

/** The upload route, and what multipart framing may add to one file (boundaries, part headers, a long file name). */
const UPLOAD_ROUTE = /^\/api\/patients\/\d{1,10}\/attachments$/
const UPLOAD_OVERHEAD_BYTES = 64 * 1024

/** multipart/form-data with a boundary. */
function isMultipart(contentType: string | undefined): boolean {
  return !!contentType && /^multipart\/form-data\s*;\s*boundary=/i.test(contentType.trim())
}

function bodyLimitFor(path: string): number {
  let limit = MAX_BODY_BYTES
  let matched = ''
  for (const [prefix, bytes] of Object.entries(LARGER_BODY_LIMITS)) {
    if (path.startsWith(prefix) && prefix.length > matched.length) {
      matched = prefix
      limit = bytes
    }
  }
  return limit
}

let publicOrigin: string | undefined
function publicUrlOrigin(): string {
  publicOrigin ??= new URL(useRuntimeConfig().publicUrl).origin
  return publicOrigin
}

function isSameSite(event: H3Event): boolean {
  const origin = getRequestHeader(event, 'origin')
  if (origin === undefined) return getRequestHeader(event, 'sec-fetch-site') === 'same-origin'
  return origin === publicUrlOrigin() || origin === getRequestURL(event).origin
}

/** application/json, with no parameter or charset=utf-8. */
function isJson(contentType: string | undefined): boolean {
  if (!contentType) return false
  const [type, ...parameters] = contentType.split(';').map(part => part.trim().toLowerCase())
  if (type !== 'application/json') return false
  return parameters.every(parameter => parameter === '' || parameter.replace(/\s*=\s*/, '=').replace(/"/g, '') === 'charset=utf-8')
}

export default defineEventHandler((event) => {
  if (!GUARDED_METHODS.has(event.method.toUpperCase())) return
  const path = event.path.split('?')[0]!
  if (!path.startsWith('/api/')) return

  if (!isSameSite(event)) throw createError({ statusCode: 403, message: 'errors.crossSite' })

  const lengthHeader = getRequestHeader(event, 'content-length')
  const chunked = getRequestHeader(event, 'transfer-encoding') !== undefined
  const length = lengthHeader === undefined ? 0 : Number(lengthHeader)
  if (length === 0 && !chunked) return

  const contentType = getRequestHeader(event, 'content-type')
  const upload = event.method.toUpperCase() === 'POST' && UPLOAD_ROUTE.test(path) && isMultipart(contentType)
  if (!upload && !isJson(contentType)) throw createError({ statusCode: 415, message: 'errors.jsonOnly' })
  if (lengthHeader === undefined) throw createError({ statusCode: 411, message: 'errors.lengthRequired' })
  const limit = upload ? ATTACHMENT_MAX_BYTES + UPLOAD_OVERHEAD_BYTES : bodyLimitFor(path)
  if (!Number.isSafeInteger(length) || length > limit) {
    throw createError({ statusCode: 413, message: 'errors.bodyTooLarge' })
  }
})
