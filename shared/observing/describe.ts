// Plain words for what a sketch shows, for learners browsing the atlas.

import type { PhaseName } from '../lunar'
import { PHASE_LABELS } from './phases'

/** −180..180 */
function wrap180(deg: number): number {
  return ((((deg + 180) % 360) + 360) % 360) - 180
}

/**
 * Where the terminator runs. The Sun's selenographic colongitude c is the longitude of the morning
 * terminator measured westward, so sunrise is at longitude −c and sunset at 180° − c (east positive);
 * while the Moon waxes (c from 270° through 0° to 90°) the sunrise line is the one on the visible side,
 * while it wanes the sunset line is (Meeus, Astronomical Algorithms, ch. 53; common practice).
 */
export function terminatorLongitude(colongitudeDeg: number): { kind: 'sunrise' | 'sunset', longitudeDeg: number } {
  const sunrise = wrap180(-colongitudeDeg)
  if (Math.abs(sunrise) <= 90) return { kind: 'sunrise', longitudeDeg: sunrise }
  return { kind: 'sunset', longitudeDeg: wrap180(180 - colongitudeDeg) }
}

function side(longitudeDeg: number): string {
  const amount = Math.round(Math.abs(longitudeDeg))
  if (amount < 2) return 'along the Moon\'s central meridian'
  return `about ${amount}° ${longitudeDeg < 0 ? 'west' : 'east'} of the Moon's central meridian`
}

export function describeLighting(c: { illuminatedFraction: number, ageDays: number, phaseName: PhaseName, colongitudeDeg: number }): string[] {
  const t = terminatorLongitude(c.colongitudeDeg)
  const lit = Math.round(c.illuminatedFraction * 100)
  return [
    `${PHASE_LABELS[c.phaseName]}: about ${lit}% of the disk is lit, ${c.ageDays.toFixed(1)} days after new moon.`,
    t.kind === 'sunrise'
      ? `The sunrise line runs ${side(t.longitudeDeg)}: craters and ridges near it cast long shadows toward the dark side.`
      : `The sunset line runs ${side(t.longitudeDeg)}: the Sun is setting on the features along it.`,
    `Colongitude ${c.colongitudeDeg.toFixed(1)}°: any sketch with a colongitude within a few degrees shows the same lighting.`,
  ]
}
