import { IdParams } from '#shared/schemas/auth'
import type { StoredCircumstances } from '#shared/observing/night'

const validParams = parseWith(IdParams)
const SAME_LIGHT_DEG = 5

// Public: one published entry, what it shows in plain terms, and others drawn under the same lighting.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validParams)
  const db = useDb()
  const row = await db.selectFrom('atlas_entries').selectAll().where('sketch_id', '=', id).executeTakeFirst()
  if (!row) throw createError({ status: 404, message: 'No such entry in the atlas.' })
  const observation = await db.selectFrom('sketches')
    .innerJoin('observations', 'observations.id', 'sketches.observation_id')
    .select(['observations.circumstances', 'observations.seeing', 'observations.transparency', 'observations.notes', 'observations.view', 'sketches.view_orientation', 'sketches.view_flip'])
    .where('sketches.id', '=', id)
    .executeTakeFirstOrThrow()
  const c = JSON.parse(observation.circumstances) as StoredCircumstances
  const lo = (row.colongitude_deg - SAME_LIGHT_DEG + 360) % 360
  const hi = (row.colongitude_deg + SAME_LIGHT_DEG) % 360
  const sameLight = await atlasQuery(db, { colongitudeMin: lo, colongitudeMax: hi, page: 1, perPage: 12 })
    .selectAll()
    .where('sketch_id', '!=', id)
    .orderBy('observed_at', 'desc')
    .limit(12)
    .execute()
  return {
    entry: atlasCard(row),
    // Only the disk's geometry leaves the server, not the site-specific altitude and azimuth.
    disk: {
      illuminatedFraction: c.illuminatedFraction,
      brightLimbAngleDeg: c.brightLimbAngleDeg,
      parallacticAngleDeg: c.parallacticAngleDeg,
      axisAngleDeg: c.axisAngleDeg,
      librationLonDeg: c.librationLonDeg,
      librationLatDeg: c.librationLatDeg,
      subSolarLatDeg: c.subSolarLatDeg,
      waxing: c.waxing,
    },
    view: { orientation: observation.view_orientation, flip: observation.view_flip },
    seeing: observation.seeing,
    transparency: observation.transparency,
    notes: observation.notes,
    sameLight: sameLight.map(atlasCard),
    pins: (await pinsOf(id)).map(p => ({ id: p.id, x: p.x, y: p.y, feature: p.feature })),
  }
})
