import sharp from 'sharp'
import type { Kysely } from 'kysely'
import type { Database, Observation } from '../../db/schema'
import { diskToSelenographic, selenographicToDisk, type DiskView } from '#shared/lunar'
import { terminatorLongitude } from '#shared/observing/describe'
import type { StoredCircumstances } from '#shared/observing/night'
import { DISK_RADIUS, SKETCH_SIZE, diskToSketch, sketchToDisk } from '#shared/sketch/frame'
import { SHADE_ALPHA, strokeOutline } from '#shared/sketch/outline'
import { SHAPES_SCHEMA_VERSION, SketchShapes, type Stroke } from '#shared/sketch/schema'
import { sketchTemplate } from '#shared/sketch/template'

// The invented demo club's published sketches: drawn here from each night's computed disk (a lit area, the
// terminator, a few craters along it), saved like an editor save, reviewed and published, with pins, so a
// fresh install shows a working atlas. Demo data only.

const VIEW: DiskView = { orientation: 'zenith-up', flip: 'none' }
// Invented places at fixed selenographic positions, so every sketch that pins one puts it in the same place.
// A night's sketch draws those that lie on the lit side within 30° of the terminator, where shadows show.
const CRATERS = [
  { name: 'Lantern ridge', lat: 18, lon: 46, r: 40, confirmed: true },
  { name: 'Brackenfield twin craters', lat: -8, lon: 21, r: 44, confirmed: true },
  { name: 'Mill pond plain', lat: 32, lon: -3, r: 54, confirmed: false },
  { name: 'Heron scarp', lat: -26, lon: -27, r: 38, confirmed: false },
  { name: 'Owl hollow', lat: 9, lon: -52, r: 36, confirmed: false },
]
const NEAR_TERMINATOR_DEG = 30

const triple = (points: number[], pressure = 0.5) => {
  const out: number[] = []
  for (let i = 0; i + 1 < points.length; i += 2) out.push(Math.round(points[i]! * 10) / 10, Math.round(points[i + 1]! * 10) / 10, pressure)
  return out
}

function circle(x: number, y: number, r: number): number[] {
  const out: number[] = []
  for (let a = 0; a <= 360; a += 20) out.push(x + r * Math.cos(a * Math.PI / 180), y + r * Math.sin(a * Math.PI / 180))
  return out
}

/** Strokes for one night, and where its craters are (selenographic), for the pins. */
export function demoDrawing(c: StoredCircumstances) {
  const template = sketchTemplate(c, VIEW)
  const strokes: Stroke[] = [
    { id: 'lit', tool: 'fill', tone: 0.82, points: triple(template.lit) },
    { id: 'terminator', tool: 'pencil', tone: 0.35, size: 10, pen: false, points: triple(template.terminator, 0.6) },
  ]
  const terminator = terminatorLongitude(c.colongitudeDeg)
  // The lit side of the terminator: east of the sunrise line, west of the sunset line.
  const litward = terminator.kind === 'sunrise' ? 1 : -1
  const places: { name: string, confirmed: boolean, x: number, y: number }[] = []
  for (const crater of CRATERS) {
    const fromTerminator = litward * (crater.lon - terminator.longitudeDeg)
    if (fromTerminator < 2 || fromTerminator > NEAR_TERMINATOR_DEG) continue
    const disk = selenographicToDisk(crater.lat, crater.lon, c, VIEW)
    if (!disk) continue
    const at = diskToSketch(disk)
    const r = crater.r
    strokes.push(
      { id: `rim-${places.length}`, tool: 'pencil', tone: 0.2, size: 6, pen: false, points: triple(circle(at.x, at.y, r), 0.5) },
      { id: `shadow-${places.length}`, tool: 'shade', tone: 0.1, size: 24, points: triple([at.x - r * 0.4, at.y - r * 0.3, at.x - r * 0.1, at.y + r * 0.3]) },
    )
    places.push({ name: crater.name, confirmed: crater.confirmed, ...at })
  }
  const shapes = SketchShapes.parse({ schemaVersion: SHAPES_SCHEMA_VERSION, frame: { size: SKETCH_SIZE, diskRadius: DISK_RADIUS }, strokes })
  return { shapes, places }
}

/** The strokes as a PNG the way the editor renders its raster: grey tones on a transparent square. */
export async function demoRaster(shapes: SketchShapes): Promise<Buffer> {
  const paths = shapes.strokes.map((stroke) => {
    const outline = strokeOutline(stroke)
    const tone = 'tone' in stroke ? Math.round(stroke.tone * 255) : 0
    const d = outline.reduce((path, v, i) => path + (i % 2 === 0 ? `${i ? 'L' : 'M'}${v.toFixed(1)} ` : `${v.toFixed(1)} `), '') + 'Z'
    const opacity = stroke.tool === 'shade' ? SHADE_ALPHA : 1
    return `<path d="${d}" fill="rgb(${tone},${tone},${tone})" fill-opacity="${opacity}"/>`
  })
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${SKETCH_SIZE}" height="${SKETCH_SIZE}">${paths.join('')}</svg>`
  return sharp(Buffer.from(svg)).png().toBuffer()
}

type DemoStatus = 'approved' | 'submitted' | 'returned'

const RETURN_COMMENT = 'Lovely start. Please add the craters you saw along the terminator near the southern cusp.'

/**
 * One demo sketch of an observation, saved like an editor save and taken through review to `status` as a
 * real review would record it; returns where its craters are, for the pins.
 */
async function sketchObservation(db: Kysely<Database>, store: ObjectStore, observation: Observation, moderatorId: string, status: DemoStatus) {
  const c = JSON.parse(observation.circumstances) as StoredCircumstances
  const { shapes, places } = demoDrawing(c)
  const id = newId()
  const saveId = newId()
  const keys = await ingestRaster(store, sketchObjectPrefix(id, saveId), await demoRaster(shapes), SKETCH_SIZE)
  const at = observation.observed_at
  const owner = observation.user_id
  const sketch = {
    id, observation_id: observation.id, user_id: owner, status, version: 2, schema_version: SHAPES_SCHEMA_VERSION,
    shapes: JSON.stringify(shapes), view_orientation: VIEW.orientation, view_flip: VIEW.flip,
    raster_key: keys.raster, thumb_small_key: keys.small, thumb_large_key: keys.large, raster_version: 2, submitted_at: at, created_at: at, updated_at: at,
  } as const
  await db.transaction().execute(async (trx) => {
    await trx.insertInto('sketches').values(sketch).execute()
    await trx.insertInto('sketch_revisions').values({
      id: newId(), sketch_id: id, version: 2, schema_version: SHAPES_SCHEMA_VERSION, shapes: sketch.shapes,
      view_orientation: VIEW.orientation, view_flip: VIEW.flip, raster_key: keys.raster, created_by: owner, created_at: at, save_id: saveId,
      checkpoint: 'submitted',
    }).execute()
    await trx.insertInto('sketch_reviews').values({ id: newId(), sketch_id: id, actor_id: owner, from_status: 'draft', to_status: 'submitted', comment: '', created_at: at }).execute()
    if (status !== 'submitted') {
      const comment = status === 'returned' ? RETURN_COMMENT : 'Clear terminator and careful shading.'
      await trx.insertInto('sketch_reviews').values({ id: newId(), sketch_id: id, actor_id: moderatorId, from_status: 'submitted', to_status: status, comment, created_at: at }).execute()
    }
    if (status === 'approved') await publish(trx, { ...sketch, version: 2 }, at)
  })
  return { id, c, places, at }
}

/** Pins the sketch's craters, naming the features the first time they are seen. */
async function pinPlaces(db: Kysely<Database>, features: Map<string, string>, ownerId: string, namerId: string, drawn: Awaited<ReturnType<typeof sketchObservation>>) {
  for (const place of drawn.places) {
    let featureId = features.get(place.name)
    if (!featureId) {
      featureId = await createFeature(db, { name: place.name, description: 'Named by the Brackenfield Moonwatchers (demo).', proposedBy: namerId })
      if (place.confirmed) await db.updateTable('features').set({ status: 'confirmed' }).where('id', '=', featureId).execute()
      features.set(place.name, featureId)
    }
    const disk = sketchToDisk(place)
    const seleno = diskToSelenographic(disk.x, disk.y, drawn.c, VIEW)
    if (!seleno) continue
    const tagId = newId()
    await db.insertInto('feature_tags').values({
      id: tagId, sketch_id: drawn.id, feature_id: featureId, user_id: ownerId, disk_x: disk.x, disk_y: disk.y,
      view_orientation: VIEW.orientation, view_flip: VIEW.flip, latitude: seleno.lat, longitude: seleno.lon, created_at: drawn.at,
    }).execute()
    await pinFormations(db, { id: tagId, sketch_id: drawn.id, latitude: seleno.lat, longitude: seleno.lon })
  }
}

/**
 * Sketches for the demo: the observer's series (most published, one waiting for review, one returned with
 * a comment); the keener pupils' campaign evenings (published under the listed group's name, one each
 * waiting); every evening of the earlier lunation's observers (one of them south of the equator).
 */
export async function seedDemoSketches(db: Kysely<Database>, store: ObjectStore): Promise<number> {
  const observer = await db.selectFrom('users').selectAll().where('email', '=', 'observer@shadowline.test').executeTakeFirst()
  const moderator = await db.selectFrom('users').selectAll().where('email', '=', 'moderator@shadowline.test').executeTakeFirst()
  if (!observer || !moderator) return 0
  const features = new Map<string, string>()
  let made = 0
  const observations = await db.selectFrom('observations').selectAll().where('user_id', '=', observer.id).orderBy('observed_at').execute()
  for (const [index, observation] of observations.entries()) {
    if (index % 2 === 1 && index !== observations.length - 1) continue
    const status = index === observations.length - 1 ? 'submitted' : index === 2 ? 'returned' : 'approved'
    await pinPlaces(db, features, observer.id, observer.id, await sketchObservation(db, store, observation, moderator.id, status))
    made += 1
  }

  const others = await db.selectFrom('observations')
    .innerJoin('users', 'users.id', 'observations.user_id')
    .selectAll('observations')
    .select('users.email')
    .where('users.email', 'in', ['ottilie@shadowline.test', 'kofi@shadowline.test', 'wren@shadowline.test', 'admin@shadowline.test'])
    .orderBy('observations.observed_at')
    .execute()
  const byUser = new Map<string, typeof others>()
  for (const o of others) byUser.set(o.user_id, [...(byUser.get(o.user_id) ?? []), o])
  for (const rows of byUser.values()) {
    for (const [index, observation] of rows.entries()) {
      if (index % 3 !== 0 && index !== rows.length - 1) continue
      // Sketches by the admin are reviewed by the moderator; the moderator's own are left unsketched.
      const status = index === rows.length - 1 && observation.email !== 'admin@shadowline.test' ? 'submitted' : 'approved'
      await pinPlaces(db, features, observation.user_id, observer.id, await sketchObservation(db, store, observation, moderator.id, status))
      made += 1
    }
  }
  // The pins came after publication, so the atlas's per-feature listing is filled from them here.
  for (const featureId of features.values()) {
    await recomputePosition(db, featureId)
    await refreshFeatureEntries(db, { featureId })
  }
  return made
}
