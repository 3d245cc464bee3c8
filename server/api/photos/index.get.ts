import { PhotoListQuery } from '#shared/schemas/photo'

const validQuery = parseWith(PhotoListQuery)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const q = await getValidatedQuery(event, validQuery)
  const db = useDb()
  let query = db.selectFrom('photos')
    .innerJoin('observations', 'observations.id', 'photos.observation_id')
    .where('photos.user_id', '=', user.id)
  if (q.siteId) query = query.where('observations.site_id', '=', q.siteId)
  const photos = await query.selectAll('photos').select('observations.site_id').orderBy('photos.taken_at').limit(1000).execute()
  const sites = new Map((await db.selectFrom('sites').selectAll().where('user_id', '=', user.id).execute()).map(s => [s.id, s]))
  return photos.flatMap(({ site_id, ...photo }) => {
    const site = sites.get(site_id)
    return site ? [photoView(photo, site)] : []
  })
})
