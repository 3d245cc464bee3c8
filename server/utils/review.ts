import type { Kysely, Transaction } from 'kysely'
import type { Database, Sketch, SketchStatus, User } from '../../db/schema'
import { hasRole } from '#shared/roles'
import { checkTransition, type EntryAction } from '#shared/review/lifecycle'
import { describeInstrument } from '#shared/observing/instrument'

export interface LastDecision {
  status: SketchStatus
  by: string
  at: string
  comment: string
}

/**
 * The sketch as an entry this user may act on or look at: the owner sees it in any state; a moderator
 * sees it once it has left the draft stage. Anything else is a 404, saying nothing about the rest.
 */
export async function visibleEntry(user: User, sketchId: string): Promise<Sketch> {
  const sketch = await useDb().selectFrom('sketches').selectAll().where('id', '=', sketchId).executeTakeFirst()
  const visible = sketch && (sketch.user_id === user.id || (hasRole(user.role, 'moderator') && sketch.status !== 'draft'))
  if (!visible) throw createError({ status: 404, message: 'No such entry.' })
  return sketch
}

async function lastDecision(db: Kysely<Database>, sketchId: string): Promise<LastDecision | null> {
  const row = await db.selectFrom('sketch_reviews')
    .innerJoin('users', 'users.id', 'sketch_reviews.actor_id')
    .select(['sketch_reviews.to_status', 'sketch_reviews.created_at', 'sketch_reviews.comment', 'users.name'])
    .where('sketch_reviews.sketch_id', '=', sketchId)
    .orderBy('sketch_reviews.created_at', 'desc')
    .limit(1)
    .executeTakeFirst()
  return row ? { status: row.to_status, by: row.name, at: row.created_at, comment: row.comment } : null
}

export async function publish(trx: Transaction<Database>, sketch: Sketch, at: string): Promise<void> {
  const row = await trx.selectFrom('observations')
    .innerJoin('sites', 'sites.id', 'observations.site_id')
    .innerJoin('users', 'users.id', 'observations.user_id')
    .select([
      'observations.observed_at', 'observations.age_days', 'observations.phase_name', 'observations.colongitude_deg',
      'observations.illuminated_fraction', 'observations.instrument_kind', 'observations.magnification',
      'observations.aperture_mm', 'observations.focal_length_mm', 'observations.eyepiece_mm',
      'sites.latitude', 'sites.longitude', 'users.name',
    ])
    .where('observations.id', '=', sketch.observation_id)
    .executeTakeFirstOrThrow()
  await trx.insertInto('atlas_entries').values({
    sketch_id: sketch.id,
    observer_id: sketch.user_id,
    observer_name: row.name,
    observed_at: row.observed_at,
    age_days: row.age_days,
    phase_name: row.phase_name,
    colongitude_deg: row.colongitude_deg,
    illuminated_fraction: row.illuminated_fraction,
    instrument_kind: row.instrument_kind,
    instrument_label: describeInstrument({
      kind: row.instrument_kind,
      magnification: row.magnification,
      apertureMm: row.aperture_mm,
      focalLengthMm: row.focal_length_mm,
      eyepieceMm: row.eyepiece_mm,
    }),
    site_latitude: roundedCoordinate(row.latitude),
    site_longitude: roundedCoordinate(row.longitude),
    published_at: at,
  }).execute()
}

/**
 * Moves an entry along its lifecycle. The status changes only if it is still the one that was checked,
 * so of two moderators deciding at once the second gets 409 with the first decision.
 */
export async function applyTransition(user: User, sketchId: string, action: EntryAction, comment: string, base: string) {
  const db = useDb()
  const sketch = await visibleEntry(user, sketchId)
  const check = checkTransition(action, { status: sketch.status, isOwner: sketch.user_id === user.id }, user.role, comment)
  if (!check.ok) {
    throw createError({ status: check.status, message: check.message, data: check.status === 409 ? { current: await lastDecision(db, sketchId), status: sketch.status } : undefined })
  }
  const at = nowIso()
  const moved = await db.transaction().execute(async (trx) => {
    const result = await trx.updateTable('sketches')
      .set({ status: check.to, updated_at: at, ...(action === 'submit' ? { submitted_at: at } : {}) })
      .where('id', '=', sketch.id)
      .where('status', '=', sketch.status)
      .executeTakeFirst()
    if (Number(result.numUpdatedRows) !== 1) return false
    await trx.insertInto('sketch_reviews').values({
      id: newId(),
      sketch_id: sketch.id,
      actor_id: user.id,
      from_status: sketch.status,
      to_status: check.to,
      comment: comment.trim(),
      created_at: at,
    }).execute()
    if (check.to === 'approved') await publish(trx, sketch, at)
    if (check.to === 'withdrawn') await trx.deleteFrom('atlas_entries').where('sketch_id', '=', sketch.id).execute()
    return true
  })
  if (!moved) {
    const current = await db.selectFrom('sketches').select('status').where('id', '=', sketch.id).executeTakeFirstOrThrow()
    throw createError({
      status: 409,
      message: `Someone else decided first: the entry is now ${current.status}.`,
      data: { current: await lastDecision(db, sketch.id), status: current.status },
    })
  }
  await audit(db, { actorId: user.id, action: `entry.${action}`, subjectType: 'sketch', subjectId: sketch.id, detail: { from: sketch.status, to: check.to } })
  if (action !== 'submit') {
    const owner = await db.selectFrom('users').select(['name', 'email']).where('id', '=', sketch.user_id).executeTakeFirstOrThrow()
    const observation = await db.selectFrom('observations').select('local_date').where('id', '=', sketch.observation_id).executeTakeFirstOrThrow()
    await sendMail(db, { to: owner.email, ...decisionMail(owner.name, action, observation.local_date, comment, `${base}/entries`, action === 'approve' ? `${base}/atlas/${sketch.id}` : undefined) })
  }
  return { status: check.to, at }
}

export async function entryHistory(db: Kysely<Database>, sketchId: string) {
  const rows = await db.selectFrom('sketch_reviews')
    .innerJoin('users', 'users.id', 'sketch_reviews.actor_id')
    .select(['sketch_reviews.id', 'sketch_reviews.from_status', 'sketch_reviews.to_status', 'sketch_reviews.comment', 'sketch_reviews.created_at', 'users.name'])
    .where('sketch_reviews.sketch_id', '=', sketchId)
    .orderBy('sketch_reviews.created_at')
    .execute()
  return rows.map(r => ({ id: r.id, from: r.from_status, to: r.to_status, comment: r.comment, at: r.created_at, by: r.name }))
}
