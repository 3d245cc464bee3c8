// The observer's own entries with their status and the latest comment.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const db = useDb()
  const rows = await db.selectFrom('sketches')
    .innerJoin('observations', 'observations.id', 'sketches.observation_id')
    .select([
      'sketches.id', 'sketches.status', 'sketches.version', 'sketches.updated_at', 'sketches.submitted_at', 'sketches.raster_key',
      'observations.id as observation_id', 'observations.local_date', 'observations.phase_name', 'observations.illuminated_fraction',
    ])
    .where('sketches.user_id', '=', user.id)
    .orderBy('sketches.updated_at', 'desc')
    .limit(500)
    .execute()
  const reviews = rows.length
    ? await db.selectFrom('sketch_reviews').select(['sketch_id', 'to_status', 'comment', 'created_at'])
        .where('sketch_id', 'in', rows.map(r => r.id))
        .where('comment', '!=', '')
        .orderBy('created_at', 'desc')
        .execute()
    : []
  return rows.map(r => ({
    id: r.id,
    status: r.status,
    updatedAt: r.updated_at,
    submittedAt: r.submitted_at,
    // Drawn from the shapes when first shown; every saved sketch has one.
    hasRaster: sketchHasImage(r),
    observationId: r.observation_id,
    localDate: r.local_date,
    phaseName: r.phase_name,
    illuminatedFraction: r.illuminated_fraction,
    comments: reviews.filter(v => v.sketch_id === r.id).map(v => ({ status: v.to_status, comment: v.comment, at: v.created_at })),
  }))
})
