import type { Role } from '#shared/auth/roles'
import { HOME_BY_ROLE } from '#shared/auth/roles'

declare module '#app' {
  interface PageMeta {
    /** Roles that may open the page; omit for pages anyone signed in may open. */
    roles?: Role[]
    /** Signed-out pages (sign-in, set password). */
    public?: boolean
  }
}

/** Every page declares who may see it; this guard enforces it before the page loads. */
export default defineNuxtRouteMiddleware((to) => {
  const { loggedIn, user } = useUserSession()
  if (to.meta.public) {
    if (loggedIn.value && user.value && to.path === '/sign-in') return navigateTo(HOME_BY_ROLE[user.value.role])
    return
  }
  if (!loggedIn.value || !user.value) {
    // Set by plugins/session-ended.server.ts when the session ended for idleness.
    const ended = useState<string | null>('session-ended', () => null).value === 'idle' ? { ended: 'idle' } : {}
    return navigateTo({ path: '/sign-in', query: { ...(to.fullPath !== '/' ? { next: to.fullPath } : {}), ...ended } })
  }
  const roles = to.meta.roles
  if (roles && !roles.includes(user.value.role)) {
    const home = HOME_BY_ROLE[user.value.role]
    // Today says why he was brought there and what he can do instead.
    return navigateTo(home === '/today' ? { path: home, query: { notAllowed: to.path } } : home)
  }
})
