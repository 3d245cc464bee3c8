// Lunation events: new moon, quarters and full moon, and the phase name of an instant.

import { AstroTime, MakeTime, MoonPhase, SearchMoonPhase } from 'astronomy-engine'
import { requireDate } from './validate'
import type { LunationBounds, PhaseEvent, PhaseKind, PhaseName } from './types'

const DAY_MS = 86_400_000

// Mean phases, Meeus, Astronomical Algorithms 2nd ed., ch. 49, eq. 49.1: JDE = 2451550.09766 + 29.530588861 k
// (k = 0 at the new moon of 2000 January 6). Written here in TT days from J2000.0 (JD 2451545.0).
const MEAN_NEW_MOON_TT = 5.09766
const SYNODIC_MONTH_DAYS = 29.530588861
// The true phase strays from the mean one by up to about 0.9 day (lunar and solar orbital eccentricity);
// ±1.5 days always brackets it.
const SEARCH_HALF_WINDOW_DAYS = 1.5

// Almanac phases are instants of equal APPARENT geocentric longitude. astronomy-engine's MoonPhase compares
// the Moon with the Sun's geometric direction, which is ahead of the apparent one by the aberration in
// longitude, 20.49″ (Meeus ch. 25: −20.4898″/R, R ≈ 1 AU, ±0.35″ over the year); the Moon's own light-time
// (1.3 s at 13.2°/day) puts its apparent position 0.7″ behind. Left alone, the library's phases come out
// 34–44 s late; aiming its search at a longitude difference 19.8″ short of the nominal one lands on the
// apparent instant to about a second.
const APPARENT_PHASE_SHIFT_DEG = (20.49 - 0.7) / 3600

const KINDS: readonly PhaseKind[] = ['new', 'first-quarter', 'full', 'last-quarter']

// Each (lunation, quarter) maps to one instant found from a fixed search window, so the answer never depends on
// which instant asked first. Bounded so a long-running server cannot grow it without limit.
const found = new Map<number, number>()
const CACHE_LIMIT = 4096

/** Forget cached phase instants (the benchmark uses it to time cold searches). */
export function resetPhaseCache(): void {
  found.clear()
}

/** UTC milliseconds of phase `quarter` (0 new, 1 first quarter, 2 full, 3 last quarter) of lunation `k`. */
function phaseInstantMs(k: number, quarter: number): number {
  const key = k * 4 + quarter
  const cached = found.get(key)
  if (cached !== undefined) return cached
  const meanTt = MEAN_NEW_MOON_TT + SYNODIC_MONTH_DAYS * (k + quarter / 4)
  const target = (quarter * 90 - APPARENT_PHASE_SHIFT_DEG + 360) % 360
  const start = AstroTime.FromTerrestrialTime(meanTt - SEARCH_HALF_WINDOW_DAYS)
  const hit = SearchMoonPhase(target, start, 2 * SEARCH_HALF_WINDOW_DAYS)
  if (hit === null) throw new Error(`lunar phase ${quarter} of lunation ${k} not found near its mean instant`)
  if (found.size >= CACHE_LIMIT) found.clear()
  found.set(key, hit.date.getTime())
  return hit.date.getTime()
}

function lunationNumberNear(time: AstroTime): number {
  return Math.floor((time.tt - MEAN_NEW_MOON_TT) / SYNODIC_MONTH_DAYS)
}

/** Lunation number k with new moon k ≤ the instant < new moon k + 1. */
function lunationOf(time: AstroTime): number {
  const ms = time.date.getTime()
  let k = lunationNumberNear(time)
  while (phaseInstantMs(k, 0) > ms) k -= 1
  while (phaseInstantMs(k + 1, 0) <= ms) k += 1
  return k
}

/** The new moons on either side of `at`: previous ≤ at < next. */
export function lunationBounds(at: Date): LunationBounds {
  const k = lunationOf(MakeTime(requireDate(at, 'at')))
  return { previousNewMoon: new Date(phaseInstantMs(k, 0)), nextNewMoon: new Date(phaseInstantMs(k + 1, 0)) }
}

/** Days since the previous new moon; `time` already validated. */
export function moonAgeDays(time: AstroTime): number {
  return (time.date.getTime() - phaseInstantMs(lunationOf(time), 0)) / DAY_MS
}

const MAX_SPAN_DAYS = 25 * 366

/** Principal phases with from ≤ at < to, in time order. */
export function phaseEvents(from: Date, to: Date): PhaseEvent[] {
  const start = requireDate(from, 'from').getTime()
  const end = requireDate(to, 'to').getTime()
  if (end < start) throw new RangeError('to must not be earlier than from')
  if (end - start > MAX_SPAN_DAYS * DAY_MS) throw new RangeError('from and to must be at most 25 years apart')
  const events: PhaseEvent[] = []
  for (let k = lunationNumberNear(MakeTime(from)) - 1; k <= lunationNumberNear(MakeTime(to)) + 1; k++) {
    KINDS.forEach((kind, quarter) => {
      const ms = phaseInstantMs(k, quarter)
      if (ms >= start && ms < end) events.push({ kind, at: new Date(ms) })
    })
  }
  return events.sort((a, b) => a.at.getTime() - b.at.getTime())
}

// The Moon gains about 12.2° a day on the Sun. Phase names are bins of the geocentric Moon−Sun difference in
// ecliptic longitude D, the quantity that defines the principal phases: each principal name covers D within
// ±12.2° of 0°, 90°, 180° or 270° (about a day either side of the instant), and the crescent and gibbous
// names fill the gaps between. The atlas groups sketches by these names.
const PRINCIPAL_HALF_WIDTH_DEG = 12.2

export function phaseNameFor(longitudeDifferenceDeg: number): PhaseName {
  const d = ((longitudeDifferenceDeg % 360) + 360) % 360
  const near = (centre: number) => Math.abs(((d - centre + 540) % 360) - 180) <= PRINCIPAL_HALF_WIDTH_DEG
  if (near(0)) return 'new'
  if (near(90)) return 'first-quarter'
  if (near(180)) return 'full'
  if (near(270)) return 'last-quarter'
  if (d < 90) return 'waxing-crescent'
  if (d < 180) return 'waxing-gibbous'
  if (d < 270) return 'waning-gibbous'
  return 'waning-crescent'
}

/**
 * The phase name at an instant from the Moon–Sun difference in ecliptic longitude (the library's MoonPhase,
 * without the 20″ aberration correction that matters only for phase instants, not for naming).
 */
export function phaseNameAt(at: Date): PhaseName {
  return phaseNameFor(moonSunLongitudeDifference(at))
}

/** The Moon's ecliptic longitude less the Sun's, 0..360: 0 at new moon, 90 at first quarter, 180 at full. */
export function moonSunLongitudeDifference(at: Date): number {
  return MoonPhase(requireDate(at, 'at'))
}
