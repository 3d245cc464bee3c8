import { createHmac, timingSafeEqual } from 'node:crypto'
import type { Kysely } from 'kysely'
import { stringify } from 'csv-stringify/sync'
import type { Database } from '../../db/schema'
import { zonedInstant } from '#shared/observing/clock'
import { predictedAtClockTime } from '#shared/observing/worksheet'
import type { ComparisonMember, ProgressGrid } from '#shared/campaigns/types'
import { enqueueMail } from './mail'

function secret(): string {
  return process.env.NUXT_SESSION_PASSWORD || String(useRuntimeConfig().session?.password ?? '')
}

function sign(membershipId: string): string {
  return createHmac('sha256', secret()).update(`reminder-opt-out:${membershipId}`).digest('base64url')
}

/** A link that switches one membership's reminders off; signed, so nothing needs storing per mail. */
export function optOutToken(membershipId: string): string {
  return `${membershipId}.${sign(membershipId)}`
}

export function readOptOutToken(token: string): string | null {
  const [id, mac] = token.split('.')
  if (!id || !mac) return null
  const expected = Buffer.from(sign(id))
  const given = Buffer.from(mac)
  return expected.length === given.length && timingSafeEqual(expected, given) ? id : null
}

const round = (x: number | null | undefined, places = 1) => (x == null ? '' : x.toFixed(places))

/** One row per member and night: what was done, then each reading beside the prediction. */
export function campaignCsv(grid: ProgressGrid, members: ComparisonMember[], predictions: { localDate: string, altitudeDeg: number, azimuthDeg: number }[]): string {
  const header = ['member', 'night', 'local_date', 'state', 'predicted_altitude_deg', 'measured_altitude_deg', 'altitude_residual_deg',
    'predicted_azimuth_deg', 'measured_azimuth_deg', 'azimuth_residual_deg', 'azimuth_residual_after_offset_deg', 'outlier']
  const rows: (string | number)[][] = [header]
  for (const row of grid.rows) {
    const readings = members.find(m => m.member.id === row.member.id)?.readings ?? []
    grid.nights.forEach((night, i) => {
      const p = predictions.find(x => x.localDate === night)
      const alt = readings.find(r => r.localDate === night && r.kind === 'altitude')
      const az = readings.find(r => r.localDate === night && r.kind === 'azimuth')
      rows.push([row.member.name, i + 1, night, row.cells[i]!.state,
        round(p?.altitudeDeg), round(alt?.measuredDeg), round(alt?.residualDeg),
        round(p?.azimuthDeg), round(az?.measuredDeg), round(az?.residualDeg), round(az?.correctedDeg),
        alt?.outlier || az?.outlier ? 'yes' : ''])
    })
  }
  return stringify(rows)
}

const CAUTION = 'Never aim binoculars or a telescope at or near the Sun. Go out with someone who knows where you are, watch your step in the dark, and dress warmly.'

/** Marks a mail as sent under a unique key; false when it already was (so nothing goes twice). */
async function claim(db: Kysely<Database>, key: string, at: string): Promise<boolean> {
  const result = await db.insertInto('campaign_mail_log').values({ key, sent_at: at })
    .onConflict(oc => oc.column('key').doNothing())
    .executeTakeFirst()
  return Number(result.numInsertedOrUpdatedRows ?? 0) === 1
}

/**
 * Queues what is due: a reminder to each member who asked for them, `reminder_minutes` before a campaign
 * night's clock time, unless the night is past or they already logged it; and at most one digest a day of
 * the leaders' new comments to each member.
 */
export async function queueCampaignMail(db: Kysely<Database>, base: string, now: Date = new Date()): Promise<{ reminders: number, digests: number }> {
  const at = now.toISOString()
  let reminders = 0
  let digests = 0
  const campaigns = await db.selectFrom('campaigns')
    .innerJoin('group_sites', 'group_sites.id', 'campaigns.group_site_id')
    .innerJoin('groups', 'groups.id', 'campaigns.group_id')
    .selectAll('campaigns')
    .select(['group_sites.name as site_name', 'group_sites.latitude', 'group_sites.longitude', 'group_sites.elevation_m', 'group_sites.time_zone', 'groups.name as group_name'])
    .execute()
  for (const c of campaigns) {
    const site = { latitude: c.latitude, longitude: c.longitude, elevation: c.elevation_m, timeZone: c.time_zone }
    const nights = JSON.parse(c.nights) as string[]
    const due = nights.filter((night) => {
      const start = zonedInstant(night, c.clock_time, c.time_zone).getTime()
      return now.getTime() >= start - c.reminder_minutes * 60_000 && now.getTime() < start
    })
    for (const night of due) {
      const [p] = predictedAtClockTime([night], c.clock_time, site)
      const members = await db.selectFrom('group_members')
        .innerJoin('users', 'users.id', 'group_members.user_id')
        .select(['group_members.id as membership_id', 'users.id', 'users.name', 'users.email'])
        .where('group_members.group_id', '=', c.group_id)
        .where('group_members.status', '=', 'active')
        .where('group_members.reminders', '=', 1)
        .where('users.disabled_at', 'is', null)
        .where(eb => eb.not(eb.exists(eb.selectFrom('observations')
          .innerJoin('sites', 'sites.id', 'observations.site_id')
          .select('observations.id')
          .whereRef('observations.user_id', '=', 'users.id')
          .where('observations.local_date', '=', night)
          .where('sites.group_site_id', '=', c.group_site_id))))
        .execute()
      for (const m of members) {
        if (!await claim(db, `reminder:${c.id}:${m.id}:${night}`, at)) continue
        const index = nights.indexOf(night) + 1
        await enqueueMail(db, {
          to: m.email,
          subject: `Tonight at ${c.clock_time}: night ${index} of ${nights.length} of ${c.title}`,
          text: `Hello ${m.name},\n\nNight ${index} of ${nights.length} of “${c.title}” (${c.group_name}) is at ${c.clock_time} at ${c.site_name}. `
            + `The Moon will stand at about ${Math.round(p!.altitudeDeg)}° altitude, azimuth ${Math.round(p!.azimuthDeg)}°, ${Math.round(p!.illuminatedFraction * 100)}% lit.\n\n`
            + `Log the evening: ${base}/observations/new?campaign=${c.id}\n\n${CAUTION}\n\n`
            + `No more reminders: ${base}/groups/reminders?token=${optOutToken(m.membership_id)}\n\nClear skies,\nShadowline\n`,
        }, now)
        reminders++
      }
    }
  }

  const pending = await db.selectFrom('campaign_comments')
    .innerJoin('users', 'users.id', 'campaign_comments.member_id')
    .innerJoin('campaigns', 'campaigns.id', 'campaign_comments.campaign_id')
    .select(['campaign_comments.id', 'campaign_comments.member_id', 'campaign_comments.local_date', 'campaign_comments.body',
      'users.name', 'users.email', 'campaigns.title', 'campaigns.id as campaign_id'])
    .where('campaign_comments.digest_at', 'is', null)
    .orderBy('campaign_comments.created_at')
    .execute()
  const byMember = new Map<string, typeof pending>()
  for (const row of pending) byMember.set(row.member_id, [...(byMember.get(row.member_id) ?? []), row])
  for (const [memberId, rows] of byMember) {
    if (!await claim(db, `digest:${memberId}:${at.slice(0, 10)}`, at)) continue
    const first = rows[0]!
    const lines = rows.map(r => `• ${r.title}, ${r.local_date}: ${r.body}`).join('\n')
    await enqueueMail(db, {
      to: first.email,
      subject: `Comments on your observing (${rows.length})`,
      text: `Hello ${first.name},\n\nYour group leader left ${rows.length === 1 ? 'a comment' : `${rows.length} comments`} on your evenings:\n\n${lines}\n\nRead them with your observations: ${base}/campaigns/${first.campaign_id}\n\nClear skies,\nShadowline\n`,
    }, now)
    await db.updateTable('campaign_comments').set({ digest_at: at }).where('id', 'in', rows.map(r => r.id)).execute()
    digests++
  }
  return { reminders, digests }
}
