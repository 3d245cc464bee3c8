import { IdParams } from '#shared/schemas/auth'
import { SitePatch } from '#shared/schemas/site'

const validParams = parseWith(IdParams)
const validBody = parseWith(SitePatch)

// Observations keep the circumstances computed when they were logged; moving a
// site does not rewrite history (each observation can be re-saved to recompute).
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const { id } = await getValidatedRouterParams(event, validParams)
  const input = await readValidatedBody(event, validBody)
  const site = await ownSite(user.id, id)
  const next = {
    name: input.name ?? site.name,
    latitude: input.latitude ?? site.latitude,
    longitude: input.longitude ?? site.longitude,
    elevation_m: input.elevation ?? site.elevation_m,
    time_zone: input.timeZone ?? site.time_zone,
    updated_at: nowIso(),
  }
  await useDb().updateTable('sites').set(next).where('id', '=', id).where('user_id', '=', user.id).execute()
  return siteDto({ ...site, ...next })
})
