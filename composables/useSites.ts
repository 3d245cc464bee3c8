export interface SiteRow {
  id: string
  name: string
  latitude: number
  longitude: number
  elevation: number
  timeZone: string
}

/** The signed-in user's observing sites. */
export function useSites() {
  return useFetch<SiteRow[]>('/api/sites', { key: 'my-sites', default: () => [] })
}
