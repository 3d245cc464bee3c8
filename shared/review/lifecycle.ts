// An atlas entry's life: draft → submitted → approved (published) or returned (with comments) → submitted
// again; a moderator may withdraw a published entry, which its owner may then submit again.

import { hasRole, type Role } from '../roles'

export const SKETCH_STATUSES = ['draft', 'submitted', 'approved', 'returned', 'withdrawn'] as const
export type SketchStatus = (typeof SKETCH_STATUSES)[number]

export const ENTRY_ACTIONS = ['submit', 'approve', 'return', 'withdraw'] as const
export type EntryAction = (typeof ENTRY_ACTIONS)[number]

interface Rule {
  from: readonly SketchStatus[]
  to: SketchStatus
  role: Role
  /** Who may act: the entry's owner, or a moderator who is not the owner. */
  actor: 'owner' | 'not-owner'
  commentRequired: boolean
}

export const RULES: Record<EntryAction, Rule> = {
  submit: { from: ['draft', 'returned', 'withdrawn'], to: 'submitted', role: 'observer', actor: 'owner', commentRequired: false },
  approve: { from: ['submitted'], to: 'approved', role: 'moderator', actor: 'not-owner', commentRequired: false },
  return: { from: ['submitted'], to: 'returned', role: 'moderator', actor: 'not-owner', commentRequired: true },
  withdraw: { from: ['approved'], to: 'withdrawn', role: 'moderator', actor: 'not-owner', commentRequired: true },
}

export type TransitionCheck
  = | { ok: true, to: SketchStatus }
    | { ok: false, status: 400 | 403 | 409, message: string }

/** Whether `action` may happen now; the server checks this and then makes the change conditionally. */
export function checkTransition(
  action: EntryAction,
  entry: { status: SketchStatus, isOwner: boolean },
  actorRole: Role,
  comment: string,
): TransitionCheck {
  const rule = RULES[action]
  if (!hasRole(actorRole, rule.role)) return { ok: false, status: 403, message: `Only a ${rule.role} may ${action} an entry.` }
  if (rule.actor === 'owner' && !entry.isOwner) return { ok: false, status: 403, message: 'Only the observer who made the sketch may submit it.' }
  if (rule.actor === 'not-owner' && entry.isOwner) return { ok: false, status: 403, message: 'Another moderator must decide on your own entry.' }
  if (!rule.from.includes(entry.status)) {
    return { ok: false, status: 409, message: `An entry that is ${entry.status} cannot be ${PAST[action]}.` }
  }
  if (rule.commentRequired && comment.trim() === '') {
    return { ok: false, status: 400, message: action === 'return' ? 'comment: Say what to improve.' : 'comment: Give the reason.' }
  }
  return { ok: true, to: rule.to }
}

const PAST: Record<EntryAction, string> = { submit: 'submitted', approve: 'approved', return: 'returned', withdraw: 'withdrawn' }

export const STATUS_LABELS: Record<SketchStatus, string> = {
  draft: 'Draft',
  submitted: 'Waiting for review',
  approved: 'In the atlas',
  returned: 'Returned with comments',
  withdrawn: 'Withdrawn from the atlas',
}
