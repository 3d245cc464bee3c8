import { createError } from 'h3'
import type { H3Event } from 'h3'
import type { Kysely } from 'kysely'
import type { Database, User } from '../../db/schema'
// Explicit and relative imports (not the #shared alias and auto-imports) let the server tests call these
// helpers, sketchesForObservations above all, directly against a test app's database.
import { hasRole } from '../../shared/roles'
import { EDITABLE_SKETCH_STATUSES } from '../../shared/sketch/api'
import type { SketchDetail, SketchSummary } from '../../shared/sketch/api'
import type { SketchShapes } from '../../shared/sketch/schema'

/** A save is the drawing's JSON plus a 2048² image; well-formed ones are far below this. */
export const SKETCH_SAVE_MAX_BYTES = 24 * 1024 * 1024

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
      .select(['id', 'observation_id', 'status', 'updated_at', 'raster_key'])
      .where('observation_id', 'in', observationIds.slice(i, i + 500))
      .orderBy('updated_at', 'desc')
      .execute()
    for (const row of rows) {
      result.get(row.observation_id)?.push({
        id: row.id,
        status: row.status,
        updatedAt: row.updated_at,
        hasRaster: row.raster_key != null,
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
      'k.created_at', 'k.updated_at',
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
    hasRaster: row.raster_key != null,
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

/** Each save writes its images under its own prefix. */
export function sketchObjectPrefix(sketchId: string, saveId: string): string {
  return `sketches/${sketchId}/${saveId}`
}

/**
 * The request body, refused with 413 past `maxBytes` whether or not the client declared its length. The rest
 * of an oversized body is read and dropped so the answer still reaches the client.
 */
export function readSketchBody(event: H3Event, maxBytes: number): Promise<Buffer> {
  return readLimitedBody(event, maxBytes, `A save is limited to ${Math.round(maxBytes / 1024 / 1024)} MB.`)
}

export interface SketchUpload {
  fields: Record<string, string>
  raster: Uint8Array | null
}

/** Splits a multipart save into its text fields and the raster file. */
export async function parseSketchUpload(event: H3Event, body: Buffer): Promise<SketchUpload> {
  const { fields, files } = await readMultipart(event, body, 'save with the drawing and its raster')
  // A drawing sent as a file part is read as text like any other field.
  for (const [name, file] of files) if (name !== 'raster') fields[name] = new TextDecoder().decode(file.bytes)
  return { fields, raster: files.get('raster')?.bytes ?? null }
}

export function sketchConflict(current: { version: number, updated_at: string }) {
  return createError({
    status: 409,
    message: `This sketch was saved elsewhere meanwhile (now version ${current.version}).`,
    data: { currentVersion: current.version, updatedAt: current.updated_at },
  })
}
