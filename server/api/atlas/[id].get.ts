import { IdParams } from '#shared/schemas/auth'
import type { StoredCircumstances } from '#shared/observing/night'

const validParams = parseWith(IdParams)
const SAME_LIGHT_DEG = 5
const SAME_LIGHT = 12

// Public: one published entry, what it shows in plain terms, and others drawn under the same lighting.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validParams)
  const db = useDb()
  const row = await db.selectFrom('atlas_entries').select(CARD_COLUMNS).where('sketch_id', '=', id).executeTakeFirst()
  if (!row) throw createError({ status: 404, message: 'No such entry in the atlas.' })
  const observation = await db.selectFrom('sketches')
    .innerJoin('observations', 'observations.id', 'sketches.observation_id')
    .select(['observations.circumstances', 'observations.seeing', 'observations.transparency', 'observations.notes', 'observations.view', 'sketches.view_orientation', 'sketches.view_flip'])
    .where('sketches.id', '=', id)
    .executeTakeFirstOrThrow()
  const c = JSON.parse(observation.circumstances) as StoredCircumstances
  // The nearest in lighting on either side of this entry, within a few degrees: two short index reads.
  const lighting = {
    colongitudeMin: (row.colongitude_deg - SAME_LIGHT_DEG + 360) % 360,
    colongitudeMax: (row.colongitude_deg + SAME_LIGHT_DEG) % 360,
    perPage: SAME_LIGHT / 2,
  }
  const here = cursorOf(row, atlasOrder(lighting))
  const darker = await atlasPage(db, { ...lighting, before: here })
  const lighter = await atlasPage(db, { ...lighting, after: here })
  const sameLight = [...darker.items, ...lighter.items].filter(e => e.sketch_id !== id)
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
