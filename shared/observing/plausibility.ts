// Checks an observation's time against the sky before it is saved. They warn, never refuse: a cloud-out, a
// note made before the Moon rose, or a plan written ahead are real entries; the observer confirms them.

export type PlausibilityKind = 'below-horizon' | 'future'

export interface PlausibilityWarning {
  kind: PlausibilityKind
  text: string
}

// A few minutes' grace for a clock that runs a little fast.
const FUTURE_GRACE_MS = 5 * 60_000

export function plausibilityWarnings(at: Date, moonAltitudeDeg: number, now: Date): PlausibilityWarning[] {
  const warnings: PlausibilityWarning[] = []
  if (at.getTime() > now.getTime() + FUTURE_GRACE_MS) {
    warnings.push({ kind: 'future', text: 'This date and time are still to come. Check the date (and the site, for its time zone); to log a plan or a note ahead, confirm below.' })
  }
  if (moonAltitudeDeg < 0) {
    warnings.push({
      kind: 'below-horizon',
      text: `At this time the Moon is ${Math.max(1, Math.round(-moonAltitudeDeg))}° below the horizon at this site, so it could not be seen. Check the date and the time (morning or evening?); if they are right, for a cloud-out or a note, confirm below.`,
    })
  }
  return warnings
}
