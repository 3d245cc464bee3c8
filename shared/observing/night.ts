// What Shadowline computes and stores beside each observation, so lists and the atlas never recompute.

import {
  LUNAR_MODEL_VERSION,
  localDateOf,
  lunarCircumstances,
  riseSetTransit,
  sunCaution,
  type LunarCircumstances,
  type RiseSetTransit,
} from '../lunar'
import { moonPass } from './moonpass'

export interface ObservingSite {
  latitude: number
  longitude: number
  elevation: number
  timeZone: string
}

export interface StoredRiseSet {
  rise: string | null
  transit: string | null
  set: string | null
}

export interface StoredCircumstances extends LunarCircumstances {
  localDate: string
  timeZone: string
  moon: StoredRiseSet
  sun: StoredRiseSet
  sunAltitudeDeg: number
  moonSunSeparationDeg: number
  caution: boolean
}

function stored(events: RiseSetTransit): StoredRiseSet {
  return {
    rise: events.rise?.toISOString() ?? null,
    transit: events.transit?.toISOString() ?? null,
    set: events.set?.toISOString() ?? null,
  }
}

export function computeNight(at: Date, site: ObservingSite): StoredCircumstances {
  const place = { latitude: site.latitude, longitude: site.longitude, elevation: site.elevation }
  const circumstances = lunarCircumstances(at, place)
  const localDate = localDateOf(at, site.timeZone)
  const caution = sunCaution(at, place)
  return {
    ...circumstances,
    localDate,
    timeZone: site.timeZone,
    // The Moon's pass under way at the instant (it rose before and sets after), or the next one: never a
    // calendar day's first rising or setting, which may belong to the night before.
    moon: (({ rise, transit, set }) => ({ rise, transit, set }))(moonPass(at, site)),
    sun: stored(riseSetTransit('sun', localDate, place, site.timeZone)),
    sunAltitudeDeg: caution.sunAltitudeDeg,
    moonSunSeparationDeg: caution.moonSunSeparationDeg,
    caution: caution.warn,
  }
}

export const COMPUTED_WITH = `shadowline-night/2 ${LUNAR_MODEL_VERSION}`
