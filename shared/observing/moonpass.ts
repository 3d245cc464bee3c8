// Moonrise, transit and moonset as an observer means them at a given moment: the pass of the Moon across
// the sky that is under way (it rose before and sets after), or else the next one. A calendar day's first
// rising and setting can belong to different passes and lie in the past (e.g. the morning's moonset shown for
// an evening); these never do.

import { Body, Observer, SearchHourAngle, SearchRiseSet } from 'astronomy-engine'
import type { ObservingSite } from './night'

export interface MoonPass {
  /** Whether the Moon is above the horizon at the moment asked about. */
  upAt: boolean
  /** The rising that begins this pass: before the moment when the Moon is up, else the next one. */
  rise: string | null
  /** The upper transit between rising and setting (or the next one, where the Moon never sets or never rises). */
  transit: string | null
  /** The setting that ends this pass, after the moment. */
  set: string | null
}

// The Moon's day is about 24 h 50 min; at high latitudes a pass can last several days, or the Moon stays
// down as long. Two days either side finds the events of an ordinary pass; beyond it they are left null.
const SEARCH_DAYS = 2
const DAY_MS = 86_400_000

export function moonPass(at: Date, site: ObservingSite): MoonPass {
  const observer = new Observer(site.latitude, site.longitude, site.elevation)
  const nextRise = SearchRiseSet(Body.Moon, observer, +1, at, SEARCH_DAYS)?.date ?? null
  const nextSet = SearchRiseSet(Body.Moon, observer, -1, at, SEARCH_DAYS)?.date ?? null
  // Up now when the next event is a setting. With neither event for days (high latitudes), the Moon is up
  // all that time if it stands above the horizon at its transit, and down all that time if not.
  const upAt = nextRise === null && nextSet === null
    ? SearchHourAngle(Body.Moon, observer, 0, at, +1).hor.altitude > 0
    : nextSet !== null && (nextRise === null || nextSet.getTime() < nextRise.getTime())
  const rise = upAt ? SearchRiseSet(Body.Moon, observer, +1, at, -SEARCH_DAYS)?.date ?? null : nextRise
  const set = upAt ? nextSet : (nextRise ? SearchRiseSet(Body.Moon, observer, -1, nextRise, SEARCH_DAYS)?.date ?? null : null)
  // The transit of this pass: after its rising; for a pass that rose days ago, the latest one before the
  // moment (a day back) or the next one.
  const transitFrom = rise ?? (upAt ? new Date(at.getTime() - DAY_MS) : at)
  const transit = SearchHourAngle(Body.Moon, observer, 0, transitFrom, +1).time.date
  return {
    upAt,
    rise: rise?.toISOString() ?? null,
    transit: set === null || transit.getTime() <= set.getTime() ? transit.toISOString() : null,
    set: set?.toISOString() ?? null,
  }
}
