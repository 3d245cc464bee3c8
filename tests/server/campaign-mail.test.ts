import type { Kysely } from 'kysely'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Database } from '../../db/schema'
import { optOutToken, queueCampaignMail, readOptOutToken } from '../../server/utils/campaignMail'
import { openTestDatabase } from '../support/database'

// Reminders and comment digests, queued straight into the outbox of a fresh database at chosen instants.

process.env.NUXT_SESSION_PASSWORD ||= 'test-session-password-that-is-long-enough-0123456789'
let db: Kysely<Database>
let close: () => Promise<void> = async () => undefined
const at = '2026-11-01T00:00:00.000Z'
// Europe/London keeps GMT (UTC+0) through November: 17:30 on the site's clock is 17:30 UTC.
const NIGHTS = ['2026-11-12', '2026-11-13', '2026-11-14']

async function user(id: string, name: string) {
  await db.insertInto('users').values({ id, email: `${id}@example.test`, name, password_hash: 'x', role: 'observer', email_verified_at: at, disabled_at: null, created_at: at, updated_at: at }).execute()
}

beforeAll(async () => {
  const opened = await openTestDatabase()
  db = opened.db
  close = opened.close
  await user('lead', 'Leader')
  await user('keen', 'Keen pupil')
  await user('quiet', 'Quiet pupil')
  await db.insertInto('groups').values({ id: 'g', name: 'Class', description: '', visibility: 'private', join_code: null, join_approval: 0, created_by: 'lead', created_at: at, updated_at: at }).execute()
  await db.insertInto('group_sites').values({ id: 'gs', group_id: 'g', name: 'Field', latitude: 52.6, longitude: -1.7, elevation_m: 90, time_zone: 'Europe/London', created_at: at, updated_at: at }).execute()
  await db.insertInto('group_members').values([
    { id: 'm-lead', group_id: 'g', user_id: 'lead', role: 'leader', status: 'active', reminders: 0, created_at: at, updated_at: at },
    { id: 'm-keen', group_id: 'g', user_id: 'keen', role: 'member', status: 'active', reminders: 1, created_at: at, updated_at: at },
    { id: 'm-quiet', group_id: 'g', user_id: 'quiet', role: 'member', status: 'active', reminders: 0, created_at: at, updated_at: at },
  ]).execute()
  await db.insertInto('campaigns').values({
    id: 'c', group_id: 'g', title: 'Crescent', brief: '', kind: 'evening', group_site_id: 'gs', clock_time: '17:30',
    nights: JSON.stringify(NIGHTS), asks_sketch: 1, asks_altitude: 1, asks_azimuth: 1, reminder_minutes: 60, created_by: 'lead', created_at: at, updated_at: at,
  }).execute()
})
afterAll(async () => {
  await close()
})

const outbox = () => db.selectFrom('mail_outbox').selectAll().orderBy('created_at').execute()

describe('campaign reminders', () => {
  it('sends nothing before the reminder time', async () => {
    expect(await queueCampaignMail(db, 'https://app.test', new Date('2026-11-12T16:29:00Z'))).toEqual({ reminders: 0, digests: 0 })
  })

  it('reminds only members who asked, once, with the position, the cautions and an opt-out link', async () => {
    const now = new Date('2026-11-12T16:45:00Z')
    expect((await queueCampaignMail(db, 'https://app.test', now)).reminders).toBe(1)
    expect((await queueCampaignMail(db, 'https://app.test', new Date('2026-11-12T17:00:00Z'))).reminders).toBe(0)
    const [mail] = await outbox()
    expect(mail!.to_address).toBe('keen@example.test')
    expect(mail!.subject).toMatch(/night 1 of 3/)
    expect(mail!.text_body).toMatch(/about -?\d+° altitude, azimuth \d+°/)
    expect(mail!.text_body).toMatch(/Never aim binoculars or a telescope at or near the Sun/)
    const link = mail!.text_body.match(/\/groups\/reminders\?token=(\S+)/)![1]!
    expect(readOptOutToken(link)).toBe('m-keen')
  })

  it('sends nothing for a night already logged, nor once the night is past', async () => {
    await db.insertInto('sites').values({ id: 's-keen', user_id: 'keen', name: 'Field', latitude: 52.6, longitude: -1.7, elevation_m: 90, time_zone: 'Europe/London', group_site_id: 'gs', created_at: at, updated_at: at }).execute()
    await db.insertInto('observations').values({
      id: 'o1', user_id: 'keen', site_id: 's-keen', observed_at: '2026-11-13T16:00:00.000Z', local_date: '2026-11-13', time_zone: 'Europe/London',
      instrument_kind: 'naked-eye', magnification: null, aperture_mm: null, focal_length_mm: null, eyepiece_mm: null, view: 'upright', seeing: null,
      transparency: null, notes: '', circumstances: '{}', computed_with: 'test', illuminated_fraction: 0.1, age_days: 3, phase_name: 'waxing-crescent',
      colongitude_deg: 300, created_at: at, updated_at: at,
    }).execute()
    expect((await queueCampaignMail(db, 'https://app.test', new Date('2026-11-13T17:00:00Z'))).reminders).toBe(0)
    expect((await queueCampaignMail(db, 'https://app.test', new Date('2026-11-14T18:00:00Z'))).reminders).toBe(0)
  })

  it('an opted-out member gets none', async () => {
    await db.updateTable('group_members').set({ reminders: 0 }).where('id', '=', 'm-keen').execute()
    expect((await queueCampaignMail(db, 'https://app.test', new Date('2026-11-14T17:00:00Z'))).reminders).toBe(0)
  })

  it('refuses a forged opt-out link', () => {
    const token = optOutToken('m-keen')
    expect(readOptOutToken(token.replace('m-keen', 'm-lead'))).toBeNull()
    expect(readOptOutToken('m-keen.not-the-signature')).toBeNull()
  })
})

describe('comment digest', () => {
  it('sends at most one digest a day, holding later comments for the next day', async () => {
    const comment = (id: string, createdAt: string) => db.insertInto('campaign_comments').values({
      id, campaign_id: 'c', member_id: 'quiet', local_date: NIGHTS[0]!, author_id: 'lead', body: `Comment ${id}`, digest_at: null, created_at: createdAt,
    }).execute()
    await comment('k1', '2026-11-15T09:00:00.000Z')
    await comment('k2', '2026-11-15T09:05:00.000Z')
    expect((await queueCampaignMail(db, 'https://app.test', new Date('2026-11-15T10:00:00Z'))).digests).toBe(1)
    const digest = (await outbox()).find(m => m.to_address === 'quiet@example.test')!
    expect(digest.text_body).toContain('Comment k1')
    expect(digest.text_body).toContain('Comment k2')
    await comment('k3', '2026-11-15T11:00:00.000Z')
    expect((await queueCampaignMail(db, 'https://app.test', new Date('2026-11-15T12:00:00Z'))).digests).toBe(0)
    expect((await queueCampaignMail(db, 'https://app.test', new Date('2026-11-16T08:00:00Z'))).digests).toBe(1)
    const all = (await outbox()).filter(m => m.to_address === 'quiet@example.test')
    expect(all).toHaveLength(2)
    expect(all[1]!.text_body).toContain('Comment k3')
    expect(all[1]!.text_body).not.toContain('Comment k1')
  })
})
