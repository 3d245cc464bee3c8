import { hasRole, type Role } from '#shared/roles'

export interface NavItem {
  to: string
  label: string
  role?: Role
}

// Each later page adds itself here with the least role that may use it.
const ITEMS: NavItem[] = [
  { to: '/', label: 'Home' },
  { to: '/atlas', label: 'Atlas' },
  { to: '/features', label: 'Features' },
  { to: '/tonight', label: 'Tonight', role: 'learner' },
  { to: '/observations', label: 'Observations', role: 'learner' },
  { to: '/sketches', label: 'Sketches', role: 'observer' },
  { to: '/worksheet', label: 'Worksheet', role: 'learner' },
  { to: '/photos', label: 'Photos', role: 'learner' },
  { to: '/sites', label: 'Sites', role: 'learner' },
  { to: '/entries', label: 'Entries', role: 'observer' },
  { to: '/review', label: 'Review', role: 'moderator' },
  { to: '/safety', label: 'Observing safely' },
  { to: '/admin/users', label: 'Accounts', role: 'admin' },
  { to: '/admin/mail', label: 'Caught mail', role: 'admin' },
  { to: '/admin/outbox', label: 'Undelivered mail', role: 'admin' },
]

/** The navigation the signed-in role may use; the server checks every route anyway. */
export function useNavigation() {
  const { user } = useUserSession()
  return computed(() => ITEMS.filter(item => !item.role || hasRole(user.value?.role, item.role)))
}
