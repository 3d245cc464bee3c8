import { createError, getRequestHeader } from 'h3'
import type { H3Event } from 'h3'
import { sql } from 'kysely'
import type { Kysely, Transaction } from 'kysely'
import type { Database, User } from '../../db/schema'
// Explicit and relative imports (not the #shared alias and auto-imports) let the server tests call these
// helpers, sketchesForObservations above all, directly against a test app's database.
import { lunarCircumstances } from '../../shared/lunar'
import type { DiskGeometry, DiskView } from '../../shared/lunar'
import { hasRole } from '../../shared/roles'
import { EDITABLE_SKETCH_STATUSES } from '../../shared/sketch/api'
import type { CheckpointReason, SketchDetail, SketchSaved, SketchSummary } from '../../shared/sketch/api'
import { SKETCH_SIZE } from '../../shared/sketch/frame'
import { StepError, applySteps } from '../../shared/sketch/operations'
import type { DrawingState, SketchStep } from '../../shared/sketch/operations'
import { SHAPES_SCHEMA_VERSION, emptyShapes } from '../../shared/sketch/schema'
import type { SketchShapes } from '../../shared/sketch/schema'
import { newId, nowIso } from './db'
import { drawRaster, storeRaster } from './raster'
import type { RasterKeys } from './raster'
import type { ObjectStore } from './storage'

/** A whole drawing at the schema's limits is under this; an autosave of a few strokes is a few kilobytes. */
export const SKETCH_SAVE_MAX_BYTES = 24 * 1024 * 1024

/** A save after this long a pause starts a new drawing session; the drawing as the last one left it is kept. */
export const SESSION_GAP_MS = 30 * 60_000
/** In a long session the whole drawing is kept again after this long of drawing... */
export const CHECKPOINT_EVERY_MS = 10 * 60_000
/**
 * ...once the operations since the last copy add up to this share of its size. Each copy then costs at most
 * three times the operations that led to it, so the history grows in step with the drawing, not its square.
 */
export const CHECKPOINT_GROWTH = 0.5

/**
 * The sketches of some observations, for the observation lists: every id asked for is a key, with [] when it
 * has none. The caller has already limited `observationIds` to what the user may see.
 */
export async function sketchesForObservations(
  db: Kysely<Database>,
  observationIds: string[],
): Promise<Map<string, SketchSummary[]>> {
  const result = new Map<string, SketchSummary[]>(observationIds.map(id => [id, []]))
  if (!observationIds.length) return result
  // Chunked so a long list stays under SQLite's limit on bound parameters.
  for (let i = 0; i < observationIds.length; i += 500) {
    const rows = await db.selectFrom('sketches')
      .select(['id', 'observation_id', 'status', 'version', 'updated_at', 'raster_key'])
      .where('observation_id', 'in', observationIds.slice(i, i + 500))
      .orderBy('updated_at', 'desc')
      .execute()
    for (const row of rows) {
      result.get(row.observation_id)?.push({
        id: row.id,
        status: row.status,
        updatedAt: row.updated_at,
        hasRaster: sketchHasImage(row),
      })
    }
  }
  return result
}

/**
 * One sketch with its observation and site, or undefined. `read` and `write` are the owner's alone: the
 * editor's data carries the exact site, and a draft is private. `review` also lets a moderator (or admin) at
 * a sketch once it has been submitted, for the routes that show nothing but the drawing and its pins. The
 * check is part of the query, so another user's sketch is simply not found.
 */
export async function findSketch(db: Kysely<Database>, user: User, id: string, access: 'read' | 'write' | 'review', withShapes = false) {
  const reviewer = access === 'review' && hasRole(user.role, 'moderator')
  return db.selectFrom('sketches as k')
    .innerJoin('observations as o', 'o.id', 'k.observation_id')
    .innerJoin('sites as s', 's.id', 'o.site_id')
    .innerJoin('users as u', 'u.id', 'k.user_id')
    // The drawing can run to megabytes; only the editor's load reads it.
    .select([
      'k.id', 'k.observation_id', 'k.user_id', 'k.status', 'k.version', 'k.schema_version',
      'k.view_orientation', 'k.view_flip', 'k.raster_key', 'k.thumb_small_key', 'k.thumb_large_key',
      'k.raster_version', 'k.created_at', 'k.updated_at',
    ])
    .$if(withShapes, qb => qb.select('k.shapes'))
    .select([
      'o.observed_at', 'o.time_zone', 'o.view as instrument_view',
      's.name as site_name', 's.latitude', 's.longitude', 's.elevation_m',
      'u.name as owner_name',
    ])
    .where('k.id', '=', id)
    .where(eb => reviewer
      ? eb.or([eb('k.user_id', '=', user.id), eb('k.status', '!=', 'draft')])
      : eb('k.user_id', '=', user.id))
    .executeTakeFirst()
}

export type FoundSketch = NonNullable<Awaited<ReturnType<typeof findSketch>>>

export function sketchIsEditable(row: FoundSketch, user: User): boolean {
  return row.user_id === user.id && EDITABLE_SKETCH_STATUSES.includes(row.status)
}

/** The editor's view of a sketch; `row` must come from findSketch with its shapes. */
export function toSketchDetail(row: FoundSketch, user: User): SketchDetail {
  if (row.shapes == null) throw new Error('toSketchDetail needs the sketch loaded with its shapes')
  return {
    id: row.id,
    status: row.status,
    version: row.version,
    editable: sketchIsEditable(row, user),
    owner: { name: row.owner_name },
    view: { orientation: row.view_orientation, flip: row.view_flip },
    // Validated by the shapes schema when it was saved.
    shapes: JSON.parse(row.shapes ?? 'null') as SketchShapes,
    hasRaster: sketchHasImage(row),
    createdAt: row.created_at,
    updatedAt: row.updated_at,
    observation: {
      id: row.observation_id,
      observedAt: row.observed_at,
      timeZone: row.time_zone,
      site: { name: row.site_name, latitude: row.latitude, longitude: row.longitude, elevation: row.elevation_m },
      view: row.instrument_view,
    },
  }
}

/** Images are stored under a prefix of their own: the save's id (images made elsewhere) or `v<version>`. */
export function sketchObjectPrefix(sketchId: string, saveId: string): string {
  return `sketches/${sketchId}/${saveId}`
}

/** An image can be shown once the sketch has been saved: it is drawn from the shapes when first asked for. */
export function sketchHasImage(row: { raster_key: string | null, version: number }): boolean {
  return row.raster_key != null || row.version > 1
}

/**
 * The request body, refused with 413 past `maxBytes` whether or not the client declared its length. The rest
 * of an oversized body is read and dropped so the answer still reaches the client.
 */
export function readSketchBody(event: H3Event, maxBytes: number): Promise<Buffer> {
  return readLimitedBody(event, maxBytes, `A save is limited to ${Math.round(maxBytes / 1024 / 1024)} MB.`)
}

/** A JSON save, read within the size limit; 415 for another kind of body, 400 for broken JSON. */
export async function readSketchJson(event: H3Event): Promise<unknown> {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!/^application\/json\b/i.test(type)) throw createError({ status: 415, message: 'Send the save as application/json.' })
  const text = (await readSketchBody(event, SKETCH_SAVE_MAX_BYTES)).toString('utf8')
  try {
    return JSON.parse(text) as unknown
  }
  catch {
    throw createError({ status: 400, message: 'The save is not valid JSON.' })
  }
}

/**
 * The text fields of a save sent as multipart, as editors from before server-drawn images sent it (a tablet
 * may replay one from its offline copy). Its image part is ignored: the server draws its own from the shapes.
 */
export async function readLegacyUpload(event: H3Event, body: Buffer): Promise<Record<string, string>> {
  const { fields, files } = await readMultipart(event, body, 'save with the drawing')
  for (const [name, file] of files) if (name !== 'raster') fields[name] = new TextDecoder().decode(file.bytes)
  return fields
}

/** The geometry the editor turns strokes with, from the same inputs, so both sides turn them alike. */
export function sketchGeometry(row: Pick<FoundSketch, 'observed_at' | 'latitude' | 'longitude' | 'elevation_m'>): DiskGeometry {
  return lunarCircumstances(new Date(row.observed_at), { latitude: row.latitude, longitude: row.longitude, elevation: row.elevation_m })
}

export function drawingOf(shapes: string, view: DiskView): DrawingState {
  // Validated by the shapes schema when it was saved.
  return { strokes: (JSON.parse(shapes) as SketchShapes).strokes, view }
}

export function shapesText(state: DrawingState): string {
  return JSON.stringify({ ...emptyShapes(), strokes: state.strokes })
}

/** The steps applied to the stored drawing; a step that does not fit is a 400 and nothing is written. */
export function applyOrRefuse(state: DrawingState, steps: readonly SketchStep[], geometry: DiskGeometry): DrawingState {
  try {
    return applySteps(state, steps, geometry)
  }
  catch (error) {
    if (error instanceof StepError) throw createError({ status: 400, message: error.message })
    throw error
  }
}

/** The answer to a retried save whose first attempt landed (its answer lost with the network), if it did. */
export async function landedSave(db: Kysely<Database>, sketchId: string, saveId: string): Promise<SketchSaved | null> {
  const landed = await db.selectFrom('sketch_revisions as r')
    .innerJoin('sketches as k', 'k.id', 'r.sketch_id')
    .select(['r.version', 'r.created_at', 'k.raster_key', 'k.version as current'])
    .where('r.sketch_id', '=', sketchId)
    .where('r.save_id', '=', saveId)
    .executeTakeFirst()
  return landed ? { id: sketchId, version: landed.version, updatedAt: landed.created_at, hasRaster: true } : null
}

export interface NewVersion {
  sketch: FoundSketch & { shapes: string }
  user: User
  baseVersion: number
  saveId: string
  next: DrawingState
  /** The steps as sent, or null for a whole-drawing save. */
  steps: readonly SketchStep[] | null
  /** Set for saves that keep the whole drawing by nature (full, restored). */
  reason: CheckpointReason | null
}

/**
 * Writes the next version in one transaction: the sketch's current drawing and a history row holding the
 * steps, or the whole drawing when this version is a checkpoint. Answers 409 when another save landed first.
 */
export async function commitVersion(db: Kysely<Database>, save: NewVersion): Promise<SketchSaved> {
  const { sketch, user, baseVersion, saveId, next } = save
  const at = nowIso()
  const version = baseVersion + 1
  const text = shapesText(next)
  const operations = save.steps ? JSON.stringify(save.steps) : null
  const saved = await db.transaction().execute(async (trx) => {
    const updated = await trx.updateTable('sketches')
      .set({
        version,
        schema_version: SHAPES_SCHEMA_VERSION,
        shapes: text,
        view_orientation: next.view.orientation,
        view_flip: next.view.flip,
        updated_at: at,
      })
      .where('id', '=', sketch.id)
      .where('user_id', '=', user.id)
      .where('version', '=', baseVersion)
      .where('status', 'in', [...EDITABLE_SKETCH_STATUSES])
      .executeTakeFirst()
    if (Number(updated.numUpdatedRows) !== 1) return false
    let reason = save.reason
    if (!reason) {
      // The first save after a long pause: keep the drawing as the last session left it.
      if (Date.parse(at) - Date.parse(sketch.updated_at) >= SESSION_GAP_MS) await keepWhole(trx, sketch.id, baseVersion, sketch.shapes, 'session')
      if (await checkpointDue(trx, sketch.id, at, operations?.length ?? 0)) reason = 'interval'
    }
    await trx.insertInto('sketch_revisions').values({
      id: newId(),
      sketch_id: sketch.id,
      version,
      schema_version: SHAPES_SCHEMA_VERSION,
      shapes: reason ? text : '',
      operations,
      checkpoint: reason,
      view_orientation: next.view.orientation,
      view_flip: next.view.flip,
      raster_key: null,
      created_by: user.id,
      created_at: at,
      save_id: saveId,
    }).execute()
    return true
  })
  if (!saved) {
    // Another save won the race between the caller's check and this update (perhaps this very save, sent twice).
    const landed = await landedSave(db, sketch.id, saveId)
    if (landed) return landed
    const current = await db.selectFrom('sketches').select(['version', 'updated_at']).where('id', '=', sketch.id).executeTakeFirstOrThrow()
    throw sketchConflict(current)
  }
  return { id: sketch.id, version, updatedAt: at, hasRaster: true }
}

/** Marks a stored version as kept whole, with its drawing; a version already kept whole stays as it is. */
async function keepWhole(trx: Transaction<Database>, sketchId: string, version: number, shapes: string, reason: CheckpointReason) {
  await trx.updateTable('sketch_revisions')
    .set({ shapes, checkpoint: reason })
    .where('sketch_id', '=', sketchId)
    .where('version', '=', version)
    .where('checkpoint', 'is', null)
    .execute()
}

async function checkpointDue(trx: Transaction<Database>, sketchId: string, at: string, addedBytes: number): Promise<boolean> {
  const last = await trx.selectFrom('sketch_revisions')
    .select(['version', 'created_at', sql<number>`length(shapes)`.as('bytes')])
    .where('sketch_id', '=', sketchId)
    .where('checkpoint', 'is not', null)
    .orderBy('version', 'desc')
    .limit(1)
    .executeTakeFirst()
  if (!last) return true
  if (Date.parse(at) - Date.parse(last.created_at) < CHECKPOINT_EVERY_MS) return false
  const since = await trx.selectFrom('sketch_revisions')
    .select(sql<number | null>`sum(length(operations))`.as('bytes'))
    .where('sketch_id', '=', sketchId)
    .where('version', '>', last.version)
    .executeTakeFirstOrThrow()
  return Number(since.bytes ?? 0) + addedBytes >= Number(last.bytes) * CHECKPOINT_GROWTH
}

/** Keeps the current version whole because it was submitted for review. */
export async function keepSubmitted(db: Kysely<Database>, sketchId: string): Promise<void> {
  await db.transaction().execute(async (trx) => {
    const sketch = await trx.selectFrom('sketches').select(['version', 'shapes']).where('id', '=', sketchId).executeTakeFirstOrThrow()
    await trx.updateTable('sketch_revisions')
      .set({ shapes: sketch.shapes, checkpoint: 'submitted' })
      .where('sketch_id', '=', sketchId)
      .where('version', '=', sketch.version)
      .execute()
  })
}

/**
 * The drawing at any stored version: the last checkpoint at or before it, and the operations after that in
 * order. Undefined when the version does not exist.
 */
export async function rebuildVersion(db: Kysely<Database>, sketch: FoundSketch, version: number): Promise<DrawingState | undefined> {
  const base = await db.selectFrom('sketch_revisions')
    .select(['version', 'shapes', 'view_orientation', 'view_flip'])
    .where('sketch_id', '=', sketch.id)
    .where('checkpoint', 'is not', null)
    .where('version', '<=', version)
    .orderBy('version', 'desc')
    .limit(1)
    .executeTakeFirst()
  if (!base || version > sketch.version) return undefined
  const rows = await db.selectFrom('sketch_revisions')
    .select(['version', 'operations'])
    .where('sketch_id', '=', sketch.id)
    .where('version', '>', base.version)
    .where('version', '<=', version)
    .orderBy('version')
    .execute()
  if (rows.length !== version - base.version || rows.some(r => r.operations == null)) {
    throw createError({ status: 500, message: `The history of this sketch cannot rebuild version ${version}.` })
  }
  const geometry = sketchGeometry(sketch)
  let state = drawingOf(base.shapes, { orientation: base.view_orientation, flip: base.view_flip })
  for (const row of rows) state = applySteps(state, JSON.parse(row.operations!) as SketchStep[], geometry)
  return state
}

const drawing = new Map<string, Promise<RasterKeys>>()

/**
 * The stored images of the sketch's current version, drawn now if they are missing or show an older version.
 * Saves never draw: an image costs about a core-second at 2,000 strokes, and most versions are never looked
 * at. It is drawn when first read (lists, review, the raster route) and on submission. Concurrent readers of
 * one version share one drawing; null before the first save, when there is nothing to show.
 */
export async function currentImages(
  db: Kysely<Database>,
  store: ObjectStore,
  row: Pick<FoundSketch, 'id' | 'version' | 'raster_key' | 'thumb_large_key' | 'thumb_small_key' | 'raster_version'>,
): Promise<RasterKeys | null> {
  if (row.raster_key && row.thumb_large_key && row.thumb_small_key && (row.raster_version ?? row.version) === row.version) {
    return { raster: row.raster_key, large: row.thumb_large_key, small: row.thumb_small_key }
  }
  if (!sketchHasImage(row)) return null
  const key = `${row.id}:${row.version}`
  let work = drawing.get(key)
  if (!work) {
    work = drawImages(db, store, row.id).finally(() => drawing.delete(key))
    drawing.set(key, work)
  }
  return work
}

async function drawImages(db: Kysely<Database>, store: ObjectStore, sketchId: string): Promise<RasterKeys> {
  const sketch = await db.selectFrom('sketches').select(['version', 'shapes']).where('id', '=', sketchId).executeTakeFirstOrThrow()
  const strokes = (JSON.parse(sketch.shapes) as SketchShapes).strokes
  const keys = await storeRaster(store, sketchObjectPrefix(sketchId, `v${sketch.version}`), await drawRaster(strokes, SKETCH_SIZE))
  // Only if no save landed meanwhile; the images stay right for the version they show either way.
  await db.updateTable('sketches')
    .set({ raster_key: keys.raster, thumb_large_key: keys.large, thumb_small_key: keys.small, raster_version: sketch.version })
    .where('id', '=', sketchId)
    .where('version', '=', sketch.version)
    .execute()
  return keys
}

export function sketchConflict(current: { version: number, updated_at: string }) {
  return createError({
    status: 409,
    message: `This sketch was saved elsewhere meanwhile (now version ${current.version}).`,
    data: { currentVersion: current.version, updatedAt: current.updated_at },
  })
}
