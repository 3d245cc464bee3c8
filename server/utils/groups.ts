import { randomBytes, randomInt } from 'node:crypto'
import type { H3Event } from 'h3'
import type { Kysely, Transaction } from 'kysely'
import type { Database, Group, GroupMember, GroupRole, GroupSite, User } from '../../db/schema'
import { JOIN_CODE_ALPHABET } from '#shared/schemas/group'

/** A group route needs this much of a membership; co-leaders may do what leaders do except name co-leaders. */
export type GroupNeed = 'member' | 'co-leader' | 'leader'

const RANK: Record<GroupRole, number> = { 'member': 0, 'co-leader': 1, 'leader': 2 }

export const INVITATION_LIFETIME_MS = 14 * 24 * 60 * 60 * 1000

export interface GroupAccess {
  user: User
  group: Group
  membership: GroupMember
}

/**
 * The group check beside requireRole: the caller's active membership with at least `need`. Someone outside
 * the group (an admin or moderator included) gets a 404 that says nothing of the group; a member below the
 * need gets a 403.
 */
export async function requireGroupRole(event: H3Event, groupId: string, need: GroupNeed): Promise<GroupAccess> {
  const user = await requireRole(event, 'learner')
  return groupAccess(user, groupId, need)
}

export async function groupAccess(user: User, groupId: string, need: GroupNeed): Promise<GroupAccess> {
  const db = useDb()
  const row = await db.selectFrom('group_members')
    .innerJoin('groups', 'groups.id', 'group_members.group_id')
    .selectAll('group_members')
    .where('group_members.group_id', '=', groupId)
    .where('group_members.user_id', '=', user.id)
    .where('group_members.status', '=', 'active')
    .executeTakeFirst()
  if (!row) throw createError({ status: 404, message: 'No such group among yours.' })
  if (RANK[row.role] < RANK[need]) {
    throw createError({ status: 403, message: need === 'member' ? 'Members only.' : `This needs the group's ${need === 'leader' ? 'leader' : 'leader or a co-leader'}.` })
  }
  const group = await db.selectFrom('groups').selectAll().where('id', '=', groupId).executeTakeFirstOrThrow()
  return { user, group, membership: row }
}

export function isLeading(role: GroupRole): boolean {
  return role !== 'member'
}

/** Eight characters from an alphabet without look-alikes: about 40 bits, enough for a code a class types. */
export function newJoinCode(): string {
  let code = ''
  for (let i = 0; i < 8; i++) code += JOIN_CODE_ALPHABET[randomInt(JOIN_CODE_ALPHABET.length)]
  return code
}

export function formatJoinCode(code: string | null): string | null {
  return code ? `${code.slice(0, 4)}-${code.slice(4)}` : null
}

export function newInvitationToken(): string {
  return randomBytes(32).toString('base64url')
}

/**
 * The member's own copy of a group site, created when missing: observations keep pointing at the member's
 * sites, and the copy says which group site it stands for.
 */
export async function ensureMemberSite(db: Kysely<Database> | Transaction<Database>, userId: string, site: GroupSite): Promise<string> {
  const existing = await db.selectFrom('sites').select('id')
    .where('user_id', '=', userId)
    .where('group_site_id', '=', site.id)
    .executeTakeFirst()
  if (existing) return existing.id
  const id = newId()
  const at = nowIso()
  await db.insertInto('sites').values({
    id,
    user_id: userId,
    name: site.name,
    latitude: site.latitude,
    longitude: site.longitude,
    elevation_m: site.elevation_m,
    time_zone: site.time_zone,
    group_site_id: site.id,
    created_at: at,
    updated_at: at,
  }).execute()
  return id
}

/** Adds (or activates) a membership and gives the member the group's sites. */
export async function addMember(db: Kysely<Database>, groupId: string, userId: string, status: 'active' | 'pending'): Promise<'added' | 'pending' | 'already'> {
  return db.transaction().execute(async (trx) => {
    const existing = await trx.selectFrom('group_members').selectAll()
      .where('group_id', '=', groupId).where('user_id', '=', userId).executeTakeFirst()
    const at = nowIso()
    if (existing?.status === 'active') return 'already'
    if (existing && status === 'pending') return 'pending'
    if (existing) {
      await trx.updateTable('group_members').set({ status: 'active', updated_at: at }).where('id', '=', existing.id).execute()
    }
    else {
      await trx.insertInto('group_members').values({
        id: newId(), group_id: groupId, user_id: userId, role: 'member', status, reminders: 0, created_at: at, updated_at: at,
      }).execute()
    }
    if (status === 'pending') return 'pending'
    const sites = await trx.selectFrom('group_sites').selectAll().where('group_id', '=', groupId).execute()
    for (const site of sites) await ensureMemberSite(trx, userId, site)
    return 'added'
  })
}

export function groupSiteDto(site: GroupSite) {
  return {
    id: site.id,
    name: site.name,
    latitude: site.latitude,
    longitude: site.longitude,
    elevation: site.elevation_m,
    timeZone: site.time_zone,
  }
}

/** The group site that belongs to the group, or a 404. */
export async function groupSiteOf(groupId: string, siteId: string): Promise<GroupSite> {
  const site = await useDb().selectFrom('group_sites').selectAll()
    .where('id', '=', siteId).where('group_id', '=', groupId).executeTakeFirst()
  if (!site) throw createError({ status: 404, message: 'No such site in this group.' })
  return site
}

/**
 * The listed group an observation was made for, if any: the observation's site is the observer's copy of a
 * site of a listed group the observer is an active member of. Used when an entry is published.
 */
export async function listedGroupOf(db: Kysely<Database> | Transaction<Database>, siteId: string, userId: string) {
  const row = await db.selectFrom('sites')
    .innerJoin('group_sites', 'group_sites.id', 'sites.group_site_id')
    .innerJoin('groups', 'groups.id', 'group_sites.group_id')
    .innerJoin('group_members', join => join
      .onRef('group_members.group_id', '=', 'groups.id')
      .on('group_members.user_id', '=', userId)
      .on('group_members.status', '=', 'active'))
    .select(['groups.id', 'groups.name', 'groups.visibility'])
    .where('sites.id', '=', siteId)
    .executeTakeFirst()
  return row ? { groupId: row.id, groupName: row.visibility === 'listed' ? row.name : null } : null
}

const INVITATION_GONE = 'This invitation link is not valid any more: it was used, withdrawn or has expired. Ask the group\'s leader for a new one.'

/** The open invitation a link stands for, or a 400 that says why not in plain words. */
export async function openInvitation(db: Kysely<Database>, token: string, now: Date = new Date()) {
  const row = await db.selectFrom('group_invitations')
    .innerJoin('groups', 'groups.id', 'group_invitations.group_id')
    .select(['group_invitations.id', 'group_invitations.group_id', 'group_invitations.email', 'groups.name as group_name'])
    .where('group_invitations.token_hash', '=', hashToken(token))
    .where('group_invitations.used_at', 'is', null)
    .where('group_invitations.revoked_at', 'is', null)
    .where('group_invitations.expires_at', '>', now.toISOString())
    .executeTakeFirst()
  if (!row) throw createError({ status: 400, message: INVITATION_GONE })
  return row
}

/** Marks the invitation used by `userId`; the conditional update keeps it single-use under a race. */
export async function useInvitation(db: Kysely<Database> | Transaction<Database>, invitationId: string, userId: string): Promise<void> {
  const result = await db.updateTable('group_invitations')
    .set({ used_at: nowIso(), used_by: userId })
    .where('id', '=', invitationId)
    .where('used_at', 'is', null)
    .where('revoked_at', 'is', null)
    .executeTakeFirst()
  if (Number(result.numUpdatedRows) !== 1) throw createError({ status: 400, message: INVITATION_GONE })
}
