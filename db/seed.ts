import { randomUUID } from 'node:crypto'
import type { Kysely } from 'kysely'
import type { Role } from '../shared/roles'
import { lunationBounds } from '../shared/lunar'
import { zonedInstant } from '../shared/observing/clock'
import { altitudeMeasurement, azimuthMeasurement } from '../shared/observing/measurements'
import { COMPUTED_WITH, computeNight } from '../shared/observing/night'
import type { Database } from './schema'
import { seedDemoGroup, seedEarlierLunation } from './seedCampaign'

// An invented scenario for the demo: the Brackenfield Moonwatchers, a school and
// village club, its people and its observing places. None of it is real.
export const DEMO_ACCOUNTS: { role: Role, name: string, email: string, password: string }[] = [
  { role: 'admin', name: 'Sela Ortsby', email: 'admin@shadowline.test', password: 'moonlit-admin' },
  { role: 'moderator', name: 'Bram Toller', email: 'moderator@shadowline.test', password: 'moonlit-moderator' },
  { role: 'observer', name: 'Idris Fenwright', email: 'observer@shadowline.test', password: 'moonlit-observer' },
  { role: 'learner', name: 'Juno Marsh-Ellery', email: 'learner@shadowline.test', password: 'moonlit-learner' },
]

export const DEMO_SITES = [
  { owner: 'observer@shadowline.test', name: 'Brackenfield school playing field', latitude: 52.634, longitude: -1.692, elevation_m: 95, time_zone: 'Europe/London' },
  { owner: 'observer@shadowline.test', name: 'Harrier Hill lay-by', latitude: 52.712, longitude: -1.811, elevation_m: 160, time_zone: 'Europe/London' },
  { owner: 'moderator@shadowline.test', name: 'Toller back garden', latitude: 52.598, longitude: -1.655, elevation_m: 88, time_zone: 'Europe/London' },
  { owner: 'admin@shadowline.test', name: 'Cape Wattle lookout', latitude: -34.21, longitude: 18.47, elevation_m: 40, time_zone: 'Africa/Johannesburg' },
]

/** Seeds the demo once, into an empty database. Returns whether it seeded. */
export async function seedDemo(
  db: Kysely<Database>,
  hashPassword: (password: string) => Promise<string>,
  now: Date = new Date(),
): Promise<boolean> {
  const existing = await db.selectFrom('users').select('id').limit(1).executeTakeFirst()
  if (existing) return false
  const at = now.toISOString()
  const ids = new Map<string, string>()
  for (const account of DEMO_ACCOUNTS) {
    const id = randomUUID()
    ids.set(account.email, id)
    await db.insertInto('users').values({
      id,
      email: account.email,
      name: account.name,
      password_hash: await hashPassword(account.password),
      role: account.role,
      email_verified_at: account.role === 'learner' ? null : at,
      disabled_at: null,
      created_at: at,
      updated_at: at,
    }).execute()
  }
  for (const { owner, ...site } of DEMO_SITES) {
    await db.insertInto('sites').values({
      id: randomUUID(),
      user_id: ids.get(owner)!,
      ...site,
      created_at: at,
      updated_at: at,
    }).execute()
  }
  const observer = ids.get('observer@shadowline.test')!
  const field = await db.selectFrom('sites').selectAll()
    .where('user_id', '=', observer).where('name', '=', DEMO_SITES[0]!.name).executeTakeFirstOrThrow()
  const start = seriesStart(now)
  const observations = await seedSeries(db, observer, field, start, now)
  const group = await seedDemoGroup(db, hashPassword, { leader: observer, learner: ids.get('learner@shadowline.test')!, leaderFieldSiteId: field.id }, start, now)
  const earlier = await seedEarlierLunation(db, [ids.get('moderator@shadowline.test')!, ids.get('admin@shadowline.test')!], start)
  await db.insertInto('audit_log').values({
    id: randomUUID(),
    at,
    actor_id: null,
    action: 'demo.seeded',
    subject_type: 'database',
    subject_id: null,
    detail: JSON.stringify({ accounts: DEMO_ACCOUNTS.length, sites: DEMO_SITES.length, observations, groupMembers: group.members, earlier }),
  }).execute()
  return true
}

/** A small deterministic generator, so the demo is the same on every machine. */
function random(seed: number): () => number {
  let state = seed
  return () => {
    state = (state + 0x6D2B79F5) | 0
    let t = Math.imul(state ^ (state >>> 15), 1 | state)
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

const CLOCK_TIME = '18:30'

/** The new moon of the latest lunation whose first quarter has passed. */
function seriesStart(now: Date): Date {
  const { previousNewMoon } = lunationBounds(now)
  return now.getTime() - previousNewMoon.getTime() < 14 * 86_400_000
    ? lunationBounds(new Date(previousNewMoon.getTime() - 86_400_000)).previousNewMoon
    : previousNewMoon
}
const CLOUDY_NIGHTS = new Set([5, 9])
/** The demo compass reads about 4° high: the worksheet should find that offset. */
const COMPASS_BIAS_DEG = 4

/**
 * Idris's campaign: the waxing half of the latest lunation whose first quarter has passed, one observation
 * an evening at the same clock time, with hand measurements that scatter as a clinometer and a compass do.
 */
async function seedSeries(
  db: Kysely<Database>,
  userId: string,
  site: { id: string, latitude: number, longitude: number, elevation_m: number, time_zone: string },
  previousNewMoon: Date,
  now: Date,
): Promise<number> {
  const place = { latitude: site.latitude, longitude: site.longitude, elevation: site.elevation_m, timeZone: site.time_zone }
  const noise = random(20261202)
  let count = 0
  for (let night = 2; night <= 13; night += 1) {
    if (CLOUDY_NIGHTS.has(night)) continue
    const day = new Date(previousNewMoon.getTime() + night * 86_400_000).toISOString().slice(0, 10)
    const at = zonedInstant(day, CLOCK_TIME, site.time_zone)
    const computed = computeNight(at, place)
    if (computed.altitudeDeg < 3) continue
    const reading = 90 - computed.altitudeDeg + (noise() - 0.5) * 3
    const altitude = altitudeMeasurement(Math.round(reading * 2) / 2, computed.altitudeDeg)
    const magneticGuess = computed.azimuthDeg + COMPASS_BIAS_DEG + (noise() - 0.5) * 4
    const declination = azimuthMeasurement(0, place, at, 0).declinationDeg ?? 0
    const bearing = (((Math.round(magneticGuess - declination)) % 360) + 360) % 360
    const azimuth = azimuthMeasurement(bearing, place, at, computed.azimuthDeg)
    const id = randomUUID()
    const stamp = now.toISOString()
    await db.insertInto('observations').values({
      id,
      user_id: userId,
      site_id: site.id,
      observed_at: at.toISOString(),
      local_date: computed.localDate,
      time_zone: site.time_zone,
      instrument_kind: 'binoculars',
      magnification: 10,
      aperture_mm: 42,
      focal_length_mm: null,
      eyepiece_mm: null,
      view: 'upright',
      seeing: 2 + Math.floor(noise() * 2),
      transparency: 3 + Math.floor(noise() * 2),
      notes: night === 2 ? 'Thin crescent low in the west-south-west, earthshine on the dark part.' : '',
      circumstances: JSON.stringify(computed),
      computed_with: COMPUTED_WITH,
      illuminated_fraction: computed.illuminatedFraction,
      age_days: computed.ageDays,
      phase_name: computed.phaseName,
      colongitude_deg: computed.colongitudeDeg,
      created_at: stamp,
      updated_at: stamp,
    }).execute()
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
    count += 1
  }
  return count
}
