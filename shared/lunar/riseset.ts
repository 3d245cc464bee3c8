// Rising, transit and setting within a local calendar day.

import { Body, Observer, SearchHourAngle, SearchRiseSet } from 'astronomy-engine'
import { requireOneOf, requireSite } from './validate'
import { localDayBounds } from './zone'
import type { RiseSetTransit, Site } from './types'

const DAY_MS = 86_400_000

/**
 * The first rising, upper transit and setting of `body` that fall within the local day. Rising and setting
 * are for the upper limb with the library's standard refraction (34′) and, for the Moon, its topocentric
 * place; the transit is the meridian crossing, whether or not the body is then above the horizon. A body
 * can skip an event on a given day (the Moon's day is ~24 h 50 min; polar day and night), giving null.
 * Very rarely, at high latitude, the Moon rises twice in one calendar day; the first rising is returned.
 */
export function bodyRiseSetTransit(body: Body, localDate: string, site: Site, timeZone: string): RiseSetTransit {
  const place = requireSite(site)
  const { start, end } = localDayBounds(localDate, timeZone)
  const observer = new Observer(place.latitude, place.longitude, place.elevation)
  const days = (end.getTime() - start.getTime()) / DAY_MS
  const within = (date: Date | undefined) => (date && date < end ? date : null)
  return {
    rise: within(SearchRiseSet(body, observer, +1, start, days)?.date),
    transit: within(SearchHourAngle(body, observer, 0, start, +1).time.date),
    set: within(SearchRiseSet(body, observer, -1, start, days)?.date),
  }
}

export function riseSetTransit(
  body: 'moon' | 'sun',
  localDate: string,
  site: Site,
  timeZone: string,
): RiseSetTransit {
  const which = requireOneOf(body, 'body', ['moon', 'sun'])
  return bodyRiseSetTransit(which === 'moon' ? Body.Moon : Body.Sun, localDate, site, timeZone)
}
