import { randomUUID } from 'node:crypto'
import { join } from 'node:path'
import Database from 'better-sqlite3'
import { COMPUTED_WITH, computeNight } from '../../shared/observing/night'

export interface ObservationSeed {
  /** The owner's e-mail; the observation goes on one of their seeded sites. */
  email: string
  /** ISO 8601 UTC. */
  observedAt: string
  view?: 'upright' | 'inverted' | 'mirrored'
  /** One of the owner's site names; the first of their sites otherwise. */
  siteName?: string
}

/**
 * Writes an observation straight into a running test app's SQLite file (WAL mode lets the test process and
 * the server share it), with the circumstances computed as the app computes them. Returns its id.
 */
export function insertObservation(dataDir: string, seed: ObservationSeed): string {
  const db = new Database(join(dataDir, 'shadowline.sqlite'))
  try {
    db.pragma('busy_timeout = 5000')
    const user = db.prepare('select id from users where email = ?').get(seed.email) as { id: string } | undefined
    if (!user) throw new Error(`No account ${seed.email} in the test app`)
    const site = db.prepare(`select * from sites where user_id = ? ${seed.siteName ? 'and name = ?' : ''} order by name limit 1`)
      .get(...[user.id, ...(seed.siteName ? [seed.siteName] : [])]) as
      { id: string, latitude: number, longitude: number, elevation_m: number, time_zone: string } | undefined
    if (!site) throw new Error(`No site for ${seed.email}`)
    const at = new Date(seed.observedAt)
    const night = computeNight(at, { latitude: site.latitude, longitude: site.longitude, elevation: site.elevation_m, timeZone: site.time_zone })
    const id = randomUUID()
    const now = new Date().toISOString()
    db.prepare(`insert into observations (id, user_id, site_id, observed_at, local_date, time_zone, instrument_kind,
      magnification, aperture_mm, focal_length_mm, eyepiece_mm, view, seeing, transparency, notes, circumstances,
      computed_with, illuminated_fraction, age_days, phase_name, colongitude_deg, created_at, updated_at)
      values (?, ?, ?, ?, ?, ?, 'telescope', 60, 90, 1000, 16.7, ?, 2, 4, '', ?, ?, ?, ?, ?, ?, ?, ?)`).run(
      id, user.id, site.id, at.toISOString(), night.localDate, site.time_zone, seed.view ?? 'upright',
      JSON.stringify(night), COMPUTED_WITH, night.illuminatedFraction, night.ageDays, night.phaseName, night.colongitudeDeg,
      now, now,
    )
    return id
  }
  finally {
    db.close()
  }
}

/** Gives an account an invented observing site, straight in the test app's database. Returns its id. */
export function insertSite(dataDir: string, email: string, site: { name: string, latitude: number, longitude: number, elevation: number, timeZone: string }): string {
  const db = new Database(join(dataDir, 'shadowline.sqlite'))
  try {
    db.pragma('busy_timeout = 5000')
    const user = db.prepare('select id from users where email = ?').get(email) as { id: string } | undefined
    if (!user) throw new Error(`No account ${email} in the test app`)
    const id = randomUUID()
    const now = new Date().toISOString()
    db.prepare(`insert into sites (id, user_id, name, latitude, longitude, elevation_m, time_zone, created_at, updated_at)
      values (?, ?, ?, ?, ?, ?, ?, ?, ?)`).run(id, user.id, site.name, site.latitude, site.longitude, site.elevation, site.timeZone, now, now)
    return id
  }
  finally {
    db.close()
  }
}
