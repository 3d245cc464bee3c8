import type { Kysely } from 'kysely'
import type { Campaign, Database, Group, GroupSite, User } from '../../db/schema'
import { predictedAtClockTime } from '#shared/observing/worksheet'
import type { ObservingSite } from '#shared/observing/night'
import { cellState, compareMembers, type MemberReadings } from '#shared/campaigns/progress'
import type { CampaignSummary, GridRow, ProgressGrid } from '#shared/campaigns/types'
import type { GroupNeed } from './groups'

export interface CampaignAccess {
  user: User
  group: Group
  campaign: Campaign
  site: GroupSite
  role: 'leader' | 'co-leader' | 'member'
}

/**
 * A campaign through its group: the group check decides. Someone outside the group gets the same 404 as
 * for a campaign that does not exist.
 */
export async function campaignAccess(user: User, campaignId: string, need: GroupNeed): Promise<CampaignAccess> {
  const db = useDb()
  const campaign = await db.selectFrom('campaigns').selectAll().where('id', '=', campaignId).executeTakeFirst()
  if (!campaign) throw createError({ status: 404, message: 'No such campaign among your groups.' })
  const { group, membership } = await groupAccess(user, campaign.group_id, need).catch((error) => {
    if (error?.statusCode === 404) throw createError({ status: 404, message: 'No such campaign among your groups.' })
    throw error
  })
  const site = await db.selectFrom('group_sites').selectAll().where('id', '=', campaign.group_site_id).executeTakeFirstOrThrow()
  return { user, group, campaign, site, role: membership.role }
}

export function campaignNights(campaign: Campaign): string[] {
  return JSON.parse(campaign.nights) as string[]
}

export function campaignSummary(campaign: Campaign, group: Group, site: GroupSite): CampaignSummary {
  return {
    id: campaign.id,
    groupId: group.id,
    groupName: group.name,
    title: campaign.title,
    brief: campaign.brief,
    kind: campaign.kind,
    clockTime: campaign.clock_time,
    site: { id: site.id, name: site.name, timeZone: site.time_zone },
    asks: { sketch: campaign.asks_sketch === 1, altitude: campaign.asks_altitude === 1, azimuth: campaign.asks_azimuth === 1 },
    nights: campaignNights(campaign),
    reminderMinutes: campaign.reminder_minutes,
  }
}

/** Where the Moon stands at the campaign's clock time on each of its nights, at the group site. */
export function campaignPredictions(campaign: Campaign, site: GroupSite) {
  return predictedAtClockTime(campaignNights(campaign), campaign.clock_time, groupObservingSite(site))
}

export function groupObservingSite(site: GroupSite): ObservingSite {
  return { latitude: site.latitude, longitude: site.longitude, elevation: site.elevation_m, timeZone: site.time_zone }
}

/** Active members, by display name: the rows of the grid and the comparison. */
function activeMembers(db: Kysely<Database>, groupId: string) {
  return db.selectFrom('group_members')
    .innerJoin('users', 'users.id', 'group_members.user_id')
    .select(['users.id', 'users.name'])
    .where('group_members.group_id', '=', groupId)
    .where('group_members.status', '=', 'active')
    .orderBy('users.name')
    .orderBy('users.id')
    .execute()
}

/**
 * The observations a campaign covers: made by a current member, at their copy of the campaign's site, on
 * one of its nights. Everything a leader sees of a member's work goes through this one filter.
 */
export function campaignObservations(db: Kysely<Database>, campaign: Campaign, memberId?: string) {
  // Driven from the members' copies of the site (a few dozen rows), then each copy's nights by index.
  return db.selectFrom('sites')
    .innerJoin('observations', 'observations.site_id', 'sites.id')
    .where('sites.group_site_id', '=', campaign.group_site_id)
    .whereRef('observations.user_id', '=', 'sites.user_id')
    .where('observations.local_date', 'in', campaignNights(campaign))
    .where('observations.user_id', 'in', eb => eb.selectFrom('group_members').select('group_members.user_id')
      .where('group_members.group_id', '=', campaign.group_id)
      .where('group_members.status', '=', 'active'))
    .$if(memberId !== undefined, q => q.where('observations.user_id', '=', memberId!))
}

/**
 * The progress grid in a fixed number of queries whatever the size of the class: members (1), the
 * covered observations with their measurement count and furthest sketch status (1), comment counts (1).
 */
export async function progressGrid(db: Kysely<Database>, access: CampaignAccess): Promise<ProgressGrid> {
  const { campaign, group, site } = access
  const nights = campaignNights(campaign)
  const members = await activeMembers(db, group.id)
  const observations = await campaignObservations(db, campaign)
    .select(eb => [
      'observations.id', 'observations.user_id', 'observations.local_date',
      eb.selectFrom('measurements').select(m => m.fn.countAll<number>().as('n'))
        .whereRef('measurements.observation_id', '=', 'observations.id').as('measured'),
      // 3 published, 2 in review, 1 any other sketch: the furthest a sketch of this observation went.
      eb.selectFrom('sketches').select(k => k.fn.max(k.case()
        .when('sketches.status', '=', 'approved').then(3)
        .when('sketches.status', '=', 'submitted').then(2)
        .else(1).end()).as('s'))
        .whereRef('sketches.observation_id', '=', 'observations.id').as('sketched'),
    ])
    .orderBy('observations.observed_at')
    .execute()
  const comments = await db.selectFrom('campaign_comments')
    .select(['member_id', 'local_date', eb => eb.fn.countAll<number>().as('n')])
    .where('campaign_id', '=', campaign.id)
    .groupBy(['member_id', 'local_date'])
    .execute()

  const commentCount = new Map(comments.map(c => [`${c.member_id} ${c.local_date}`, Number(c.n)]))
  const nightIndex = new Map(nights.map((n, i) => [n, i]))
  const rowOf = new Map<string, GridRow>(members.map(m => [m.id, {
    member: { id: m.id, name: m.name },
    cells: nights.map(n => ({ state: 'nothing' as const, observationId: null, comments: commentCount.get(`${m.id} ${n}`) ?? 0 })),
    total: 0,
  }]))
  for (const o of observations) {
    const row = rowOf.get(o.user_id)
    const i = nightIndex.get(o.local_date)
    if (!row || i === undefined) continue
    const sketched = Number(o.sketched ?? 0)
    const state = cellState({
      measurements: Number(o.measured ?? 0),
      sketchStatuses: sketched === 3 ? ['approved'] : sketched === 2 ? ['submitted'] : sketched === 1 ? ['draft'] : [],
    })
    const cell = row.cells[i]!
    if (cell.observationId === null || CELL_ORDER[state] >= CELL_ORDER[cell.state]) {
      row.cells[i] = { ...cell, state, observationId: o.id }
    }
  }
  const rows = [...rowOf.values()]
  for (const row of rows) row.total = row.cells.filter(c => c.state !== 'nothing').length
  return {
    campaign: campaignSummary(campaign, group, site),
    nights,
    rows,
    nightTotals: nights.map((_, i) => rows.filter(r => r.cells[i]!.state !== 'nothing').length),
    queries: GRID_QUERIES,
  }
}

/**
 * Queries progressGrid runs, stated with the grid: see its comment. The grid route adds five more, also
 * fixed: the session's account, the campaign, the membership, the group and its site.
 */
export const GRID_QUERIES = 3

const CELL_ORDER = { nothing: 0, logged: 1, measured: 2, sketched: 3, submitted: 4, published: 5 } as const

/** Every member's readings against the prediction (one query), with offsets and outliers. */
export async function classComparison(db: Kysely<Database>, access: CampaignAccess) {
  const members = await activeMembers(db, access.group.id)
  const readings = await campaignObservations(db, access.campaign)
    .innerJoin('measurements', 'measurements.observation_id', 'observations.id')
    .select(['observations.user_id', 'observations.local_date', 'observations.observed_at', 'measurements.kind',
      'measurements.derived_deg', 'measurements.predicted_deg', 'measurements.residual_deg'])
    .orderBy('observations.observed_at')
    .execute()
  const byMember: MemberReadings[] = members.map(m => ({
    member: { id: m.id, name: m.name },
    readings: readings.filter(r => r.user_id === m.id).map(r => ({
      localDate: r.local_date,
      kind: r.kind,
      measuredDeg: r.derived_deg,
      predictedDeg: r.predicted_deg,
      residualDeg: r.residual_deg,
    })),
  }))
  return {
    campaign: campaignSummary(access.campaign, access.group, access.site),
    predictions: campaignPredictions(access.campaign, access.site).map(p => ({ localDate: p.localDate, at: p.at, altitudeDeg: p.altitudeDeg, azimuthDeg: p.azimuthDeg })),
    members: compareMembers(byMember),
  }
}

/** The member must be an active member of the campaign's group, else 404 (nothing said about anyone else). */
export async function requireCampaignMember(db: Kysely<Database>, access: CampaignAccess, memberId: string) {
  const member = await db.selectFrom('group_members')
    .innerJoin('users', 'users.id', 'group_members.user_id')
    .select(['users.id', 'users.name'])
    .where('group_members.group_id', '=', access.group.id)
    .where('group_members.user_id', '=', memberId)
    .where('group_members.status', '=', 'active')
    .executeTakeFirst()
  if (!member) throw createError({ status: 404, message: 'No such member in this group.' })
  return member
}
