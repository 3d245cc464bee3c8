// Local calendar days in an IANA time zone, with the zone rules the runtime's Intl carries.

import { requireDate, requireLocalDate } from './validate'

const DAY_MS = 86_400_000

const formatters = new Map<string, Intl.DateTimeFormat>()

export function formatterFor(timeZone: unknown, field: string): Intl.DateTimeFormat {
  if (typeof timeZone !== 'string' || timeZone === '') {
    throw new RangeError(`${field} must be an IANA time zone name such as 'Europe/London'; got ${String(timeZone)}`)
  }
  let formatter = formatters.get(timeZone)
  if (!formatter) {
    try {
      formatter = new Intl.DateTimeFormat('en-US', {
        timeZone,
        hourCycle: 'h23',
        year: 'numeric',
        month: 'numeric',
        day: 'numeric',
        hour: 'numeric',
        minute: 'numeric',
        second: 'numeric',
      })
    }
    catch {
      throw new RangeError(`${field} must be an IANA time zone name such as 'Europe/London'; got ${JSON.stringify(timeZone)}`)
    }
    formatters.set(timeZone, formatter)
  }
  return formatter
}

/** The wall-clock reading in the zone, written as if it were a UTC instant (milliseconds). */
export function wallClockMs(instantMs: number, formatter: Intl.DateTimeFormat): number {
  const part: Record<string, number> = {}
  for (const { type, value } of formatter.formatToParts(new Date(instantMs))) part[type] = Number(value)
  const wall = new Date(0)
  wall.setUTCFullYear(part.year ?? 0, (part.month ?? 1) - 1, part.day ?? 1)
  wall.setUTCHours(part.hour ?? 0, part.minute ?? 0, part.second ?? 0, 0)
  return wall.getTime()
}

function offsetMs(instantMs: number, formatter: Intl.DateTimeFormat): number {
  const whole = Math.floor(instantMs / 1000) * 1000
  return wallClockMs(whole, formatter) - whole
}

/** The first instant whose local date is the given wall-clock midnight's date. */
function startOfLocalDay(midnightWallMs: number, formatter: Intl.DateTimeFormat): number {
  // Offsets a day before and after bracket any change of offset near this midnight.
  const before = offsetMs(midnightWallMs - DAY_MS, formatter)
  const after = offsetMs(midnightWallMs + DAY_MS, formatter)
  const readsMidnight = [midnightWallMs - before, midnightWallMs - after]
    .filter(t => wallClockMs(t, formatter) === midnightWallMs)
  // Two candidates: midnight happened twice (clocks went back over it); the day starts at the first.
  if (readsMidnight.length > 0) return Math.min(...readsMidnight)
  // None: the clocks jumped over midnight, and the day begins at the jump, still on the old offset.
  return midnightWallMs - before
}

/** The instants [start, end) that make up a calendar day in a time zone (23 or 25 hours on clock-change days). */
export function localDayBounds(localDate: string, timeZone: string): { start: Date, end: Date } {
  const { year, month, day } = requireLocalDate(localDate, 'localDate')
  const formatter = formatterFor(timeZone, 'timeZone')
  const midnight = new Date(0)
  midnight.setUTCFullYear(year, month - 1, day)
  const wall = midnight.getTime()
  const start = startOfLocalDay(wall, formatter)
  const end = startOfLocalDay(wall + DAY_MS, formatter)
  if (end <= start) throw new RangeError(`localDate ${localDate} does not exist in ${timeZone}: the zone skipped that day`)
  return { start: new Date(start), end: new Date(end) }
}

/** The calendar date (YYYY-MM-DD) of an instant in a time zone. */
export function localDateOf(at: Date, timeZone: string): string {
  const wall = new Date(wallClockMs(requireDate(at, 'at').getTime(), formatterFor(timeZone, 'timeZone')))
  return wall.toISOString().slice(0, 10)
}
