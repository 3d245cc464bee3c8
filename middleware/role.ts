import { hasRole, type Role } from '#shared/roles'

declare module '#app' {
  interface PageMeta {
    /** The least role that may open the page (the server checks its routes anyway). */
    role?: Role
  }
}

export default defineNuxtRouteMiddleware(async (to) => {
  const needed = to.meta.role
  if (!needed) return
  const { loggedIn, user, fetch } = useUserSession()
  if (!loggedIn.value) await fetch()
  if (!loggedIn.value) return navigateTo({ path: '/sign-in', query: { next: to.fullPath } })
  if (!hasRole(user.value?.role, needed)) {
    return abortNavigation(createError({ status: 403, message: `This page needs the ${needed} role.` }))
  }
})
