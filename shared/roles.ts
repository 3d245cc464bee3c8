// Roles are ordered: each one may do everything the ones before it may.
export const ROLES = ['learner', 'observer', 'moderator', 'admin'] as const
export type Role = (typeof ROLES)[number]

export function roleRank(role: Role): number {
  return ROLES.indexOf(role)
}

export function hasRole(role: Role | undefined | null, needed: Role): boolean {
  return role != null && roleRank(role) >= roleRank(needed)
}

export const ROLE_LABELS: Record<Role, string> = {
  learner: 'Learner',
  observer: 'Observer',
  moderator: 'Moderator',
  admin: 'Administrator',
}
