// Azimuths across north: 355° then 5° is a step of +10°, not −350°. Charts plot the unwrapped series (an axis
// that runs on past 360° or below 0°, labelled back into 0–360°), so a wrap never draws as a line across the
// chart, and trend texts read the signed change from it.

/** Each value moved by whole turns to lie within 180° of the one before; the series is then shifted by whole
 * turns so that its middle lies in 0–360°. Nulls (no value) are kept, and do not break the chain. */
export function unwrapDegrees(values: (number | null)[]): (number | null)[] {
  const out: (number | null)[] = []
  let previous: number | null = null
  for (const v of values) {
    if (v == null) {
      out.push(null)
      continue
    }
    const next: number = previous == null ? v : v + 360 * Math.round((previous - v) / 360)
    out.push(next)
    previous = next
  }
  const present = out.filter((v): v is number => v != null)
  if (present.length === 0) return out
  const middle = (Math.min(...present) + Math.max(...present)) / 2
  const shift = -360 * Math.floor(middle / 360)
  return out.map(v => (v == null ? null : v + shift))
}

/** An axis label for an unwrapped azimuth: back into 0–360°. */
export function azimuthLabel(value: number): string {
  return `${Math.round(((value % 360) + 360) % 360)}°`
}

/** Axis bounds for an unwrapped series: whole multiples of `step` around it. */
export function axisBounds(values: (number | null)[], step = 45): { min: number, max: number } {
  const present = values.filter((v): v is number => v != null)
  if (present.length === 0) return { min: 0, max: 360 }
  return { min: step * Math.floor(Math.min(...present) / step), max: step * Math.ceil(Math.max(...present) / step) }
}
