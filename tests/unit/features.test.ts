import { randomUUID } from 'node:crypto'
import type { Kysely } from 'kysely'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createDatabase } from '../../db/connect'
import { migrateToLatest } from '../../db/migrate'
import type { Database } from '../../db/schema'
import { nameKey, nameProblem, trigrams } from '../../shared/features/names'
import { angularDistance, distanceFromTerminator, meanPosition } from '../../shared/features/position'
import { diskToSelenographic, lunarCircumstances, selenographicToDisk, type DiskView } from '../../shared/lunar'
import { addName, createFeature, featureAliases, mergeFeatures, recomputePosition, searchFeatures } from '../../server/utils/features'

describe('feature names', () => {
  it('fold case, accents and punctuation', () => {
    expect(nameKey('  Théophilus ')).toBe('theophilus')
    expect(nameKey('Rupes  Recta — the Straight Wall')).toBe('rupes recta the straight wall')
    expect(nameKey('ÅNGSTRÖM')).toBe('angstrom')
    expect(nameKey('Ærdwell Strøm')).toBe('aerdwell strom')
    expect(trigrams('ab')).toEqual(['  a', ' ab', 'ab '])
  })

  it('refuse empty, over-long and control-character names', () => {
    expect(nameProblem('   ')).toMatch(/name/)
    expect(nameProblem('x'.repeat(81))).toMatch(/80/)
    expect(nameProblem('bright\u0007ray')).toMatch(/letters/)
    expect(nameProblem('—')).toMatch(/letter or digit/)
    expect(nameProblem('Bright ray system')).toBeNull()
  })
})

// Two invented observing nights at two invented sites, seen through different instruments.
const NIGHT_A = { at: new Date('2026-11-16T18:30:00Z'), site: { latitude: 52.63, longitude: -1.69, elevation: 95 }, view: { orientation: 'zenith-up', flip: 'mirrored' } as DiskView }
const NIGHT_B = { at: new Date('2027-03-16T19:45:00Z'), site: { latitude: -34.21, longitude: 18.47, elevation: 40 }, view: { orientation: 'north-up', flip: 'inverted' } as DiskView }

describe('pins on sketches', () => {
  it('at the disk centre land on the sub-observer point (the librations), in every view', () => {
    const c = lunarCircumstances(NIGHT_A.at, NIGHT_A.site)
    for (const orientation of ['north-up', 'zenith-up'] as const) {
      for (const flip of ['none', 'inverted', 'mirrored'] as const) {
        const p = diskToSelenographic(0, 0, c, { orientation, flip })!
        expect(p.lat).toBeCloseTo(c.librationLatDeg, 6)
        expect(p.lon).toBeCloseTo(c.librationLonDeg, 6)
      }
    }
  })

  it('of one place, drawn on two nights with different librations and flips, meet within 0.5°', () => {
    const a = lunarCircumstances(NIGHT_A.at, NIGHT_A.site)
    const b = lunarCircumstances(NIGHT_B.at, NIGHT_B.site)
    // The nights differ enough for the test to mean something.
    expect(Math.hypot(a.librationLonDeg - b.librationLonDeg, a.librationLatDeg - b.librationLatDeg)).toBeGreaterThan(3)
    const truth = { lat: -11.4, lon: 26.4 }
    // Where each observer would put the pin, off by a hand's unsteadiness (0.004 of the radius).
    const onA = selenographicToDisk(truth.lat, truth.lon, a, NIGHT_A.view)!
    const onB = selenographicToDisk(truth.lat, truth.lon, b, NIGHT_B.view)!
    expect(Math.hypot(onA.x - onB.x, onA.y - onB.y)).toBeGreaterThan(0.2)
    const pinA = diskToSelenographic(onA.x + 0.004, onA.y - 0.003, a, NIGHT_A.view)!
    const pinB = diskToSelenographic(onB.x - 0.002, onB.y + 0.004, b, NIGHT_B.view)!
    expect(angularDistance(pinA, pinB)).toBeLessThan(0.5)
    const mean = meanPosition([pinA, pinB])!
    expect(angularDistance(mean, truth)).toBeLessThan(0.5)
    expect(mean.spreadDeg).toBeLessThan(0.5)
  })

  it('average correctly across the ±180° seam', () => {
    const mean = meanPosition([{ lat: 0, lon: 179 }, { lat: 0, lon: -179 }])!
    expect(Math.abs(mean.lon)).toBeCloseTo(180, 6)
  })

  it('are near the terminator at first quarter when near the central meridian (Meeus ch. 53: c = 90° − l0)', () => {
    expect(distanceFromTerminator({ lat: 0, lon: 0 }, 0, 0)).toBeCloseTo(0, 6)
    expect(distanceFromTerminator({ lat: 0, lon: -30 }, 30, 0)).toBeCloseTo(0, 6)
    expect(distanceFromTerminator({ lat: 0, lon: 45 }, 0, 0)).toBeCloseTo(45, 6)
  })
})

describe('the gazetteer', () => {
  let db: Kysely<Database>
  const user = randomUUID()
  const sketches: string[] = []

  beforeAll(async () => {
    db = await createDatabase({ url: ':memory:', dataDir: '/tmp' })
    await migrateToLatest(db)
    const at = new Date().toISOString()
    await db.insertInto('users').values({ id: user, email: 'gaz@example.test', name: 'Gaz', password_hash: 'x', role: 'observer', email_verified_at: at, disabled_at: null, created_at: at, updated_at: at }).execute()
    const site = randomUUID()
    await db.insertInto('sites').values({ id: site, user_id: user, name: 'Field', latitude: 52, longitude: -1, elevation_m: 0, time_zone: 'Europe/London', created_at: at, updated_at: at }).execute()
    for (let i = 0; i < 3; i += 1) {
      const observation = randomUUID()
      await db.insertInto('observations').values({
        id: observation, user_id: user, site_id: site, observed_at: at, local_date: '2026-11-16', time_zone: 'Europe/London',
        instrument_kind: 'naked-eye', magnification: null, aperture_mm: null, focal_length_mm: null, eyepiece_mm: null, view: 'upright',
        seeing: null, transparency: null, notes: '', circumstances: '{}', computed_with: 'test', illuminated_fraction: 0.5, age_days: 7,
        phase_name: 'first-quarter', colongitude_deg: 0, created_at: at, updated_at: at,
      }).execute()
      const sketch = randomUUID()
      await db.insertInto('sketches').values({ id: sketch, observation_id: observation, user_id: user, schema_version: 1, shapes: '{}', view_orientation: 'zenith-up', view_flip: 'none', raster_key: null, thumb_small_key: null, thumb_large_key: null, created_at: at, updated_at: at }).execute()
      sketches.push(sketch)
    }
  })
  afterAll(async () => {
    await db?.destroy()
  })

  async function pin(sketch: string, feature: string, lat: number, lon: number) {
    await db.insertInto('feature_tags').values({ id: randomUUID(), sketch_id: sketch, feature_id: feature, user_id: user, disk_x: 0, disk_y: 0, view_orientation: 'zenith-up', view_flip: 'none', latitude: lat, longitude: lon, created_at: new Date().toISOString() }).execute()
    await recomputePosition(db, feature)
  }

  it('finds a name by an alias, without accents, and despite a slip of a letter', async () => {
    const id = await createFeature(db, { name: 'Théophilus', description: '', proposedBy: user })
    await addName(db, id, 'The three-ringed crater', 'alias')
    // A proposal pinned on no submitted sketch is found by its proposer only.
    expect(await searchFeatures(db, 'theophilus')).toEqual([])
    expect((await searchFeatures(db, 'theophilus', 20, undefined, user))[0]?.id).toBe(id)
    expect((await searchFeatures(db, 'THEOPH', 20, undefined, user))[0]?.id).toBe(id)
    expect((await searchFeatures(db, 'theofilus', 20, undefined, user))[0]?.id).toBe(id)
    const byAlias = await searchFeatures(db, 'three ringed', 20, undefined, user)
    expect(byAlias[0]).toMatchObject({ id, matched: 'The three-ringed crater' })
    // One word right and one mistyped: the right word must not hide the name from the likeness search.
    expect((await searchFeatures(db, 'three rnged', 20, undefined, user))[0]?.id).toBe(id)
    expect(await searchFeatures(db, 'zzzz', 20, undefined, user)).toEqual([])
    await expect(createFeature(db, { name: 'THEOPHILUS', description: '', proposedBy: user })).rejects.toMatchObject({ statusCode: 409 })
  })

  it('merges a duplicate: every pin follows, every name becomes an alias, and the duplicate stays', async () => {
    const keep = await createFeature(db, { name: 'Long wall', description: '', proposedBy: user })
    const dup = await createFeature(db, { name: 'Straight cliff', description: '', proposedBy: user })
    await addName(db, dup, 'The line', 'alias')
    await pin(sketches[0]!, keep, -21.8, -7.7)
    await pin(sketches[1]!, dup, -22.2, -7.9)
    await pin(sketches[2]!, dup, -21.9, -7.6)
    await mergeFeatures(db, dup, keep)

    const tags = await db.selectFrom('feature_tags').select('feature_id').where('sketch_id', 'in', sketches).execute()
    expect(tags.filter(t => t.feature_id === keep)).toHaveLength(3)
    expect(await featureAliases(db, keep)).toEqual(['Straight cliff', 'The line'])
    const gone = await db.selectFrom('features').selectAll().where('id', '=', dup).executeTakeFirstOrThrow()
    expect(gone.merged_into).toBe(keep)
    const kept = await db.selectFrom('features').selectAll().where('id', '=', keep).executeTakeFirstOrThrow()
    expect(kept.pin_count).toBe(3)
    expect(kept.latitude).toBeCloseTo((-21.8 - 22.2 - 21.9) / 3, 1)
    expect((await searchFeatures(db, 'straight cliff', 20, undefined, user))[0]?.id).toBe(keep)
    await expect(mergeFeatures(db, dup, keep)).rejects.toMatchObject({ statusCode: 404 })
  })
})
