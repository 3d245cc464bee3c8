import type { Kysely } from 'kysely'
import type { Database } from '../../db/schema'

// What a deleted row owned in the object store goes with it. Every object of a sketch lives under
// `sketches/<id>/` and of a photo under `photos/<user>/<id>/`, so removing a prefix removes every saved
// version and thumbnail. When the store cannot be reached the prefix waits in `object_removals`, and the
// outbox timer tries again (removeQueuedObjects), so nothing is left behind for good.

export function sketchPrefix(sketchId: string): string {
  return `sketches/${sketchId}/`
}

export function photoPrefix(userId: string, photoId: string): string {
  return `photos/${userId}/${photoId}/`
}

async function removePrefix(prefix: string): Promise<void> {
  const store = useObjectStore()
  for (const key of await store.list(prefix)) await store.remove(key)
}

/** Removes the objects under each prefix now, or queues the ones that fail. */
export async function removeStoredObjects(db: Kysely<Database>, prefixes: string[]): Promise<void> {
  for (const prefix of prefixes) {
    try {
      await removePrefix(prefix)
    }
    catch {
      await db.insertInto('object_removals')
        .values({ object_key: prefix, queued_at: nowIso(), attempts: 0 })
        .onConflict(oc => oc.column('object_key').doNothing())
        .execute()
    }
  }
}

/** Retries queued removals; run on the outbox timer. */
export async function removeQueuedObjects(db: Kysely<Database>, batch = 20): Promise<void> {
  const queued = await db.selectFrom('object_removals').selectAll().orderBy('queued_at').limit(batch).execute()
  for (const row of queued) {
    try {
      await removePrefix(row.object_key)
      await db.deleteFrom('object_removals').where('object_key', '=', row.object_key).execute()
    }
    catch {
      await db.updateTable('object_removals').set({ attempts: row.attempts + 1 }).where('object_key', '=', row.object_key).execute()
    }
  }
}

/**
 * Deletes an observation and everything it owns: its sketches (with their revisions, reviews and pins, by
 * cascade) and its photos, then the stored objects of both, and puts the pinned features' counts and
 * positions right again.
 */
export async function deleteObservation(db: Kysely<Database>, userId: string, observationId: string): Promise<void> {
  const sketches = await db.selectFrom('sketches').select('id').where('observation_id', '=', observationId).execute()
  const photos = await db.selectFrom('photos').select(['id', 'user_id']).where('observation_id', '=', observationId).execute()
  const sketchIds = sketches.map(s => s.id)
  const features = sketchIds.length
    ? await db.selectFrom('feature_tags').select('feature_id').distinct().where('sketch_id', 'in', sketchIds).execute()
    : []
  await db.transaction().execute(async (trx) => {
    await trx.deleteFrom('observations').where('id', '=', observationId).where('user_id', '=', userId).execute()
    for (const { feature_id } of features) await recomputePosition(trx, feature_id)
  })
  await removeStoredObjects(db, [...sketchIds.map(sketchPrefix), ...photos.map(p => photoPrefix(p.user_id, p.id))])
}

/**
 * An observation made only to hold a photo ("Started from a photo.", never edited) goes once no photo, sketch
 * or measurement needs it: re-timing or deleting the photo leaves nothing it created behind.
 */
export async function dropPhotoStartedObservation(db: Kysely<Database>, userId: string, observationId: string): Promise<void> {
  await db.deleteFrom('observations')
    .where('id', '=', observationId)
    .where('user_id', '=', userId)
    .where('notes', '=', PHOTO_STARTED_NOTE)
    .whereRef('created_at', '=', 'updated_at')
    .where(eb => eb.not(eb.exists(eb.selectFrom('photos').select('photos.id').whereRef('photos.observation_id', '=', 'observations.id'))))
    .where(eb => eb.not(eb.exists(eb.selectFrom('sketches').select('sketches.id').whereRef('sketches.observation_id', '=', 'observations.id'))))
    .where(eb => eb.not(eb.exists(eb.selectFrom('measurements').select('measurements.id').whereRef('measurements.observation_id', '=', 'observations.id'))))
    .execute()
}
