import { SiteBody } from '#shared/schemas/site'

const validate = parseWith(SiteBody)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const input = await readValidatedBody(event, validate)
  const at = nowIso()
  const site = {
    id: newId(),
    user_id: user.id,
    name: input.name,
    latitude: input.latitude,
    longitude: input.longitude,
    elevation_m: input.elevation,
    time_zone: input.timeZone || timeZoneAt(input.latitude, input.longitude),
    created_at: at,
    updated_at: at,
  }
  await useDb().insertInto('sites').values(site).execute()
  setResponseStatus(event, 201)
  return siteDto(site)
})
