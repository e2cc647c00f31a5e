import { HOME_BY_ROLE } from '#shared/auth/roles'

/**
 * What the sign-in forms do once the server has signed him in (password, then the second
 * factor): take the session and his language here, then go on to the page he was sent from
 * (`next`, a path on this site only) or his role's home.
 */
export function useFormSignedIn() {
  const route = useRoute()
  const { setLocale } = useI18n()
  const { fetch: refreshSession, user } = useUserSession()
  const home = () => (user.value ? HOME_BY_ROLE[user.value.role] : '/')

  async function takeSession() {
    await refreshSession()
    if (user.value) await setLocale(user.value.language)
  }

  async function goOn() {
    const next = route.query.next
    await navigateTo(typeof next === 'string' && next.startsWith('/') && !next.startsWith('//') ? next : home())
  }

  return { takeSession, goOn, home }
}
