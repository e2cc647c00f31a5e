/*
 * A server render whose session cookie the server refused (signed out elsewhere, password
 * changed, idle: server/utils/auth/sessions.ts, which also clears the cookie on this page's
 * response) remembers why, so the guard (middleware/auth.global.ts) can send him to the
 * sign-in page with the reason. Asking again costs no query: the page request's check is
 * shared. A half-signed-in cookie (second factor still to come) is not refused.
 */
export default defineNuxtPlugin(async () => {
  const { loggedIn } = useUserSession()
  if (loggedIn.value || !useCookie('tidewell-session').value) return
  const refused = await useRequestFetch()('/api/_auth/session').then(
    () => null,
    (error: { statusCode?: number, data?: { message?: string } }) => (error?.statusCode === 401 ? error.data?.message ?? 'errors.signedOut' : null),
  )
  if (!refused) return
  useState('session-ended', () => (refused === 'errors.sessionIdle' ? 'idle' : 'ended'))
})
