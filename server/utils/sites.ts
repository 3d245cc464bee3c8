import tzlookup from '@photostructure/tz-lookup'
import type { Site } from '../../db/schema'
import type { ObservingSite } from '#shared/observing/night'

/** The zone from the coordinates, with an offline boundary table (no network look-up). */
export function timeZoneAt(latitude: number, longitude: number): string {
  return tzlookup(latitude, longitude)
}

export function observingSite(site: Site): ObservingSite {
  return { latitude: site.latitude, longitude: site.longitude, elevation: site.elevation_m, timeZone: site.time_zone }
}

export function siteDto(site: Omit<Site, 'group_site_id'> & { group_site_id?: string | null }) {
  return {
    id: site.id,
    name: site.name,
    latitude: site.latitude,
    longitude: site.longitude,
    elevation: site.elevation_m,
    timeZone: site.time_zone,
    /** A copy of a group's site: the group's leaders see what is logged there for their campaigns. */
    groupSite: site.group_site_id != null,
  }
}

/** The owner's site, or a 404 that says nothing about anyone else's. */
export async function ownSite(userId: string, siteId: string): Promise<Site> {
  const site = await useDb().selectFrom('sites').selectAll()
    .where('id', '=', siteId)
    .where('user_id', '=', userId)
    .executeTakeFirst()
  if (!site) throw createError({ status: 404, message: 'No such site among yours.' })
  return site
}

/** The owner's site named in a form: someone else's, or none, is a bad field (400), not a missing page. */
export async function chosenSite(userId: string, siteId: string): Promise<Site> {
  return ownSite(userId, siteId).catch(() => {
    throw createError({ status: 400, message: 'siteId: Choose one of your sites.', data: { fields: { siteId: ['Choose one of your sites.'] } } })
  })
}

/** Published entries show a site only to 0.1°, never the owner's precise place. */
export function roundedCoordinate(value: number): number {
  return Math.round(value * 10) / 10
}
