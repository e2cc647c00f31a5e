import { AsyncLocalStorage } from 'node:async_hooks'
import type { H3Event } from 'h3'

/*
 * The request from the browser that a request belongs to. A server render calls the API
 * in-process ($fetch to /api during SSR): those internal requests have no socket, so no
 * client address, and any header they carry was copied from the browser's request. They
 * run inside the page request's scope (server/plugins/00.audit-outcome.ts opens one per
 * request from outside), so clientIp() can ask the page request instead.
 */
const scope = new AsyncLocalStorage<H3Event>()

/** Runs a request from outside in its own scope; the internal calls it makes join it. */
export function withRequestScope<T>(event: H3Event, fn: () => T): T {
  return scope.getStore() ? fn() : scope.run(event, fn)
}

/** The outermost request of this scope (the browser's), or undefined outside any request. */
export function outerRequest(): H3Event | undefined {
  return scope.getStore()
}
