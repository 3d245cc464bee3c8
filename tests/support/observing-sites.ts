// Four invented observing sites, one for each kind of sky planning must hold for.
export const SITES = {
  'mid-north': { latitude: 52.634, longitude: -1.692, elevation: 95, timeZone: 'Europe/London' },
  'mid-south': { latitude: -33.93, longitude: 18.47, elevation: 40, timeZone: 'Africa/Johannesburg' },
  'near the equator': { latitude: -1.29, longitude: 36.82, elevation: 1700, timeZone: 'Africa/Nairobi' },
  'high north in summer': { latitude: 64.14, longitude: -21.9, elevation: 20, timeZone: 'Atlantic/Reykjavik' },
}

export type SiteName = keyof typeof SITES

// A whole lunation for each: the lunation around 2026-12-02 (a waning evening), and for the high-northern
// site one in its summer, June–July 2026.
export const LUNATION_FROM: Record<SiteName, string> = {
  'mid-north': '2026-11-20',
  'mid-south': '2026-11-20',
  'near the equator': '2026-11-20',
  'high north in summer': '2026-06-10',
}

export const siteEntries = () => Object.entries(SITES) as [SiteName, (typeof SITES)[SiteName]][]
