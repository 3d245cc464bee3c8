import { randomUUID } from 'node:crypto'
import type { Kysely } from 'kysely'
import { localDateOf, lunationBounds } from '../shared/lunar'
import { localDateTimeOf, zonedInstant } from '../shared/observing/clock'
import { altitudeMeasurement, azimuthMeasurement } from '../shared/observing/measurements'
import { COMPUTED_WITH, computeNight } from '../shared/observing/night'
import { proposeCampaign } from '../shared/campaigns/propose'
import type { Database } from './schema'

// The invented club's class: a group led by the demo observer, with pupils at different levels of progress
// in last lunation's campaign, a campaign still to come, and observers of an earlier lunation (one of them in
// the southern hemisphere) whose sketches fill the atlas. Every name and place is invented.

export const DEMO_GROUP_NAME = 'Brackenfield Moonwatchers'
export const DEMO_PUPIL_PASSWORD = 'moonlit-member'

/** Pupils: how many of the campaign's nights each logs, and how they read their instruments. */
export const DEMO_PUPILS = [
  { name: 'Ottilie Brandreth', email: 'ottilie@shadowline.test', share: 1, measures: true, compassBias: 2, misread: -1 },
  { name: 'Kofi Ashdown', email: 'kofi@shadowline.test', share: 0.9, measures: true, compassBias: -9, misread: -1 },
  { name: 'Wren Halloway', email: 'wren@shadowline.test', share: 0.75, measures: true, compassBias: 5, misread: 3 },
  { name: 'Piet Varga-Moss', email: 'piet@shadowline.test', share: 0.6, measures: true, compassBias: 0, misread: -1 },
  { name: 'Esme Calloway', email: 'esme@shadowline.test', share: 0.45, measures: false, compassBias: 0, misread: -1 },
  { name: 'Rafe Dunmore', email: 'rafe@shadowline.test', share: 0.3, measures: true, compassBias: 12, misread: -1 },
  { name: 'Nia Pennock', email: 'nia@shadowline.test', share: 0.15, measures: false, compassBias: 0, misread: -1 },
  { name: 'Tobias Greel', email: 'tobias@shadowline.test', share: 0, measures: false, compassBias: 0, misread: -1 },
] as const

const FIELD = { name: 'Brackenfield school playing field', latitude: 52.634, longitude: -1.692, elevation_m: 95, time_zone: 'Europe/London' }
const CLOCK_TIME = '18:30'

interface SiteRow { id: string, latitude: number, longitude: number, elevation_m: number, time_zone: string }

function random(seed: number): () => number {
  let state = seed
  return () => {
    state = (state + 0x6D2B79F5) | 0
    let t = Math.imul(state ^ (state >>> 15), 1 | state)
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/** One evening's observation with hand readings that scatter as a clinometer and a compass do. */
export async function seedEvening(
  db: Kysely<Database>,
  userId: string,
  site: SiteRow,
  localDate: string,
  clockTime: string,
  reading: { measures: boolean, compassBias: number, misreadDeg: number, noise: () => number, notes?: string },
): Promise<string | null> {
  const place = { latitude: site.latitude, longitude: site.longitude, elevation: site.elevation_m, timeZone: site.time_zone }
  const at = zonedInstant(localDate, clockTime, site.time_zone)
  const computed = computeNight(at, place)
  if (computed.altitudeDeg < 3) return null
  const id = randomUUID()
  const stamp = at.toISOString()
  await db.insertInto('observations').values({
    id,
    user_id: userId,
    site_id: site.id,
    observed_at: stamp,
    local_date: computed.localDate,
    time_zone: site.time_zone,
    instrument_kind: 'naked-eye',
    magnification: null,
    aperture_mm: null,
    focal_length_mm: null,
    eyepiece_mm: null,
    view: 'upright',
    seeing: 2 + Math.floor(reading.noise() * 2),
    transparency: 2 + Math.floor(reading.noise() * 3),
    notes: reading.notes ?? '',
    circumstances: JSON.stringify(computed),
    computed_with: COMPUTED_WITH,
    illuminated_fraction: computed.illuminatedFraction,
    age_days: computed.ageDays,
    phase_name: computed.phaseName,
    colongitude_deg: computed.colongitudeDeg,
    created_at: stamp,
    updated_at: stamp,
  }).execute()
  if (reading.measures) {
    const clinometer = 90 - computed.altitudeDeg + (reading.noise() - 0.5) * 4
    const altitude = altitudeMeasurement(Math.round(clinometer), computed.altitudeDeg)
    const declination = azimuthMeasurement(0, place, at, 0).declinationDeg ?? 0
    const guess = computed.azimuthDeg + reading.compassBias + reading.misreadDeg + (reading.noise() - 0.5) * 5 - declination
    const azimuth = azimuthMeasurement(((Math.round(guess) % 360) + 360) % 360, place, at, computed.azimuthDeg)
    await db.insertInto('measurements').values([altitude, azimuth].map(m => ({
      id: randomUUID(),
      observation_id: id,
      kind: m.kind,
      raw_deg: m.rawDeg,
      derived_deg: m.derivedDeg,
      predicted_deg: m.predictedDeg,
      residual_deg: m.residualDeg,
      declination_deg: m.declinationDeg,
      created_at: stamp,
    }))).execute()
  }
  return id
}

async function addUser(db: Kysely<Database>, name: string, email: string, passwordHash: string, at: string): Promise<string> {
  const id = randomUUID()
  await db.insertInto('users').values({
    id, email, name, password_hash: passwordHash, role: 'observer', email_verified_at: at, disabled_at: null, created_at: at, updated_at: at,
  }).execute()
  return id
}

async function addMemberSite(db: Kysely<Database>, userId: string, groupSiteId: string, at: string): Promise<SiteRow> {
  const site = { id: randomUUID(), user_id: userId, ...FIELD, group_site_id: groupSiteId, created_at: at, updated_at: at }
  await db.insertInto('sites').values(site).execute()
  return site
}

/**
 * The demo group and its campaigns. `lunationStart` is the new moon of the demo observer's series, so last
 * lunation's campaign lines up with it; `leaderFieldSiteId` is the observer's own field site, which becomes
 * their copy of the group site.
 */
export async function seedDemoGroup(
  db: Kysely<Database>,
  hashPassword: (password: string) => Promise<string>,
  ids: { leader: string, learner: string, leaderFieldSiteId: string },
  lunationStart: Date,
  now: Date,
): Promise<{ groupId: string, members: number }> {
  const at = now.toISOString()
  const groupId = randomUUID()
  await db.insertInto('groups').values({
    id: groupId,
    name: DEMO_GROUP_NAME,
    description: 'Year 8 and the village club: crescent to full, every clear evening at half past six.',
    visibility: 'listed',
    join_code: 'MOON4BRK',
    join_approval: 0,
    created_by: ids.leader,
    created_at: at,
    updated_at: at,
  }).execute()
  const groupSiteId = randomUUID()
  await db.insertInto('group_sites').values({ id: groupSiteId, group_id: groupId, ...FIELD, created_at: at, updated_at: at }).execute()
  await db.updateTable('sites').set({ group_site_id: groupSiteId }).where('id', '=', ids.leaderFieldSiteId).execute()

  const member = async (userId: string, role: 'leader' | 'member', reminders: boolean) => db.insertInto('group_members').values({
    id: randomUUID(), group_id: groupId, user_id: userId, role, status: 'active', reminders: reminders ? 1 : 0, created_at: at, updated_at: at,
  }).execute()
  await member(ids.leader, 'leader', false)
  await member(ids.learner, 'member', true)
  await addMemberSite(db, ids.learner, groupSiteId, at)

  const site = { latitude: FIELD.latitude, longitude: FIELD.longitude, elevation: FIELD.elevation_m, timeZone: FIELD.time_zone }
  const lastNights = proposeCampaign('evening', localDateOf(lunationStart, FIELD.time_zone), 16, site).nights
    .filter(n => n.proposed).map(n => n.localDate)
  const campaign = (title: string, nights: string[], brief: string) => ({
    id: randomUUID(), group_id: groupId, title, brief, kind: 'evening' as const, group_site_id: groupSiteId, clock_time: CLOCK_TIME,
    nights: JSON.stringify(nights), asks_sketch: 1, asks_altitude: 1, asks_azimuth: 1, reminder_minutes: 60,
    created_by: ids.leader, created_at: at, updated_at: at,
  })
  const last = campaign('Crescent to full', lastNights, 'Go out at 18:30 on every clear evening. Sketch the Moon, then measure its altitude with the protractor clinometer and its bearing with the compass, standing on the centre spot of the field.')
  await db.insertInto('campaigns').values(last).execute()

  // The next waxing series that is not over yet: this lunation's, or the next one's.
  const { previousNewMoon, nextNewMoon } = lunationBounds(now)
  const today = localDateOf(now, FIELD.time_zone)
  let nextNights = proposeCampaign('evening', localDateOf(previousNewMoon, FIELD.time_zone), 16, site).nights.filter(n => n.proposed).map(n => n.localDate)
  if ((nextNights.at(-1) ?? '') < today) {
    nextNights = proposeCampaign('evening', localDateOf(nextNewMoon, FIELD.time_zone), 16, site).nights.filter(n => n.proposed).map(n => n.localDate)
  }
  const next = campaign('Second lunation: the terminator\'s craters', nextNights, 'This time, sketch the craters along the terminator and pin at least one on your sketch.')
  await db.insertInto('campaigns').values(next).execute()

  const noise = random(8_1202)
  const pupilHash = await hashPassword(DEMO_PUPIL_PASSWORD)
  for (const [index, pupil] of DEMO_PUPILS.entries()) {
    const userId = await addUser(db, pupil.name, pupil.email, pupilHash, at)
    await member(userId, 'member', index % 3 === 0)
    const mySite = await addMemberSite(db, userId, groupSiteId, at)
    const count = Math.round(pupil.share * lastNights.length)
    for (const [n, night] of lastNights.entries()) {
      // Spread each pupil's nights over the campaign rather than bunching them at the start.
      if (count === 0 || Math.floor((n + 1) * count / lastNights.length) === Math.floor(n * count / lastNights.length)) continue
      await seedEvening(db, userId, mySite, night, CLOCK_TIME, {
        measures: pupil.measures, compassBias: pupil.compassBias, misreadDeg: n === pupil.misread ? 28 : 0, noise,
      })
    }
    for (const night of nextNights.filter(d => d < today).slice(0, Math.round(pupil.share * 3))) {
      await seedEvening(db, userId, mySite, night, CLOCK_TIME, { measures: pupil.measures, compassBias: pupil.compassBias, misreadDeg: 0, noise })
    }
  }

  const comment = async (email: string, nightIndex: number, body: string) => {
    const row = await db.selectFrom('users').select('id').where('email', '=', email).executeTakeFirstOrThrow()
    const night = lastNights[Math.min(nightIndex, lastNights.length - 1)]!
    await db.insertInto('campaign_comments').values({
      id: randomUUID(), campaign_id: last.id, member_id: row.id, local_date: night, author_id: ids.leader, body, digest_at: at, created_at: at,
    }).execute()
  }
  await comment('kofi@shadowline.test', 1, 'Your compass reads about 9° low every night: a steady offset, so your trend is still right. Keep it away from the bike rack.')
  await comment('wren@shadowline.test', 3, 'This bearing is far from the others. Did you read the other end of the needle?')
  await comment('ottilie@shadowline.test', 0, 'A lovely first crescent, and earthshine noted. Well done.')
  return { groupId, members: DEMO_PUPILS.length + 2 }
}

/** Observers of the lunation before the series, one in each hemisphere, for the atlas. */
export async function seedEarlierLunation(db: Kysely<Database>, userIds: string[], lunationStart: Date): Promise<number> {
  const { previousNewMoon } = lunationBounds(new Date(lunationStart.getTime() - 86_400_000))
  const noise = random(20261101)
  let count = 0
  for (const userId of userIds) {
    const site = await db.selectFrom('sites').selectAll().where('user_id', '=', userId).where('group_site_id', 'is', null).orderBy('name').executeTakeFirst()
    if (!site) continue
    const place = { latitude: site.latitude, longitude: site.longitude, elevation: site.elevation_m, timeZone: site.time_zone }
    const nights = proposeCampaign('evening', localDateOf(previousNewMoon, site.time_zone), 16, place).nights.filter(n => n.verdict === 'good')
    for (const [n, night] of nights.entries()) {
      if (n % 3 !== 1) continue
      const clock = localDateTimeOf(new Date(night.at), site.time_zone).time
      if (await seedEvening(db, userId, site, night.localDate, clock, { measures: true, compassBias: 1, misreadDeg: 0, noise })) count++
    }
  }
  return count
}
