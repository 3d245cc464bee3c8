// The reference formations (IAU-named) on the disk: which lie under a pin, how they project in the
// observer's view, which labels fit, and which stand near the terminator and how high the Sun is there.

import { selenographicToDisk } from '../lunar'
import type { DiskGeometry, DiskView } from '../lunar'
import { nameKey } from './names'
import { angularDistance, type SelenoPoint } from './position'

const DEG = Math.PI / 180

/** The Moon's mean radius, km (IAU Working Group on Cartographic Coordinates: 1737.4 km). */
export const MOON_RADIUS_KM = 1737.4

export type FormationKind
  = | 'oceanus' | 'mare' | 'sinus' | 'lacus' | 'palus'
    | 'crater' | 'mons' | 'montes' | 'promontorium' | 'rupes' | 'vallis' | 'rima'

export const FORMATION_KINDS: readonly FormationKind[] = [
  'oceanus', 'mare', 'sinus', 'lacus', 'palus', 'crater', 'mons', 'montes', 'promontorium', 'rupes', 'vallis', 'rima',
]

/** Plain words for each kind, for lists and labels. */
export const KIND_LABEL: Record<FormationKind, string> = {
  oceanus: 'ocean', mare: 'sea', sinus: 'bay', lacus: 'lake', palus: 'marsh',
  crater: 'crater', mons: 'mountain', montes: 'mountain range', promontorium: 'cape',
  rupes: 'scarp', vallis: 'valley', rima: 'rille',
}

export interface Formation {
  /** A stable slug of the name, e.g. "mare-imbrium". */
  id: string
  name: string
  kind: FormationKind
  /** Centre, degrees; longitude east-positive. */
  latitude: number
  longitude: number
  /** Diameter, or a range's or rille's length, km. */
  diameterKm: number
}

/** The slug of a name: its folded key with spaces as hyphens ("Crüger" → "cruger"). */
export function formationId(name: string): string {
  return nameKey(name).replace(/ /g, '-')
}

/** Half the diameter as an angle at the Moon's centre, degrees. */
export function angularRadiusDeg(f: Pick<Formation, 'diameterKm'>): number {
  return (f.diameterKm / 2 / MOON_RADIUS_KM) / DEG
}

const centre = (f: Formation): SelenoPoint => ({ lat: f.latitude, lon: f.longitude })

/** Whether a selenographic point lies within the formation's outline (its centre and radius). */
export function contains(f: Formation, p: SelenoPoint): boolean {
  return angularDistance(centre(f), p) <= angularRadiusDeg(f)
}

export interface Suggestion {
  formation: Formation
  /** Angle from the point to the formation's outline, degrees; 0 when the point is inside. */
  outsideDeg: number
}

/** How far beyond its outline a formation still counts as near a pin: about 45 km, a pin's likely slip. */
export const NEAR_DEG = 1.5

/**
 * The formations under or near a pinned point, nearest first: those whose outline contains it (the
 * smallest, most particular, first: a crater before the sea it lies in), then those within NEAR_DEG of
 * their outline by distance from it.
 */
export function suggestFormations(formations: readonly Formation[], p: SelenoPoint, limit = 6): Suggestion[] {
  return formations
    .map(formation => ({ formation, outsideDeg: Math.max(0, angularDistance(centre(formation), p) - angularRadiusDeg(formation)) }))
    .filter(s => s.outsideDeg <= NEAR_DEG)
    .sort((a, b) => a.outsideDeg - b.outsideDeg || a.formation.diameterKm - b.formation.diameterKm)
    .slice(0, limit)
}

/** A formation on the disk: an ellipse in unit-disk coordinates of the view (y up). */
export interface ProjectedFormation {
  formation: Formation
  x: number
  y: number
  /** Half-axis along the direction from the disk's centre (foreshortened), and across it. */
  radial: number
  across: number
  /** Direction of the radial axis, degrees counter-clockwise from +x. */
  angleDeg: number
}

/**
 * Projects a formation with the same projection as pins (selenographicToDisk: libration, axis angle and
 * view). A small circle on the sphere of angular radius r seen orthographically at angle θ from the
 * sub-observer point is an ellipse with half-axes sin r across and sin r · cos θ along the radius
 * (foreshortening), where sin θ is the centre's distance from the disk's centre.
 */
export function projectFormation(f: Formation, geometry: DiskGeometry, view: DiskView): ProjectedFormation | null {
  const at = selenographicToDisk(f.latitude, f.longitude, geometry, view)
  if (!at) return null
  const rho = Math.min(1, Math.hypot(at.x, at.y))
  const size = Math.sin(Math.min(90, angularRadiusDeg(f)) * DEG)
  return {
    formation: f,
    x: at.x,
    y: at.y,
    radial: size * Math.sqrt(1 - rho * rho),
    across: size,
    angleDeg: rho > 1e-9 ? Math.atan2(at.y, at.x) / DEG : 0,
  }
}

export interface LabelBox {
  /** Projected formation and where its label goes, in screen pixels (y down). */
  item: ProjectedFormation
  left: number
  top: number
  width: number
  height: number
}

/**
 * Declutters labels by size and zoom: a formation is labelled when it spans at least `minPx` on screen,
 * the largest first, and a label that would overlap one already placed is dropped. `toScreen` maps unit-disk
 * points to screen pixels; `textWidth` estimates a label's width.
 */
export function placeLabels(
  items: readonly ProjectedFormation[],
  pxPerDisk: number,
  toScreen: (x: number, y: number) => { x: number, y: number },
  textWidth: (text: string) => number,
  lineHeight: number,
  minPx = 14,
): LabelBox[] {
  const placed: LabelBox[] = []
  const sorted = [...items].sort((a, b) => b.formation.diameterKm - a.formation.diameterKm)
  for (const item of sorted) {
    if (2 * item.across * pxPerDisk < minPx) continue
    const at = toScreen(item.x, item.y)
    const width = textWidth(item.formation.name)
    const box = { item, left: at.x - width / 2, top: at.y - lineHeight / 2, width, height: lineHeight }
    const clash = placed.some(p => box.left < p.left + p.width && p.left < box.left + box.width
      && box.top < p.top + p.height && p.top < box.top + box.height)
    if (!clash) placed.push(box)
  }
  return placed
}

/**
 * The Sun's altitude over a point of the Moon, degrees, from the Sun's selenographic colongitude c0 and
 * the sub-solar latitude b0: sin h = sin b0 sin β + cos b0 cos β sin(c0 + λ) (Meeus, Astronomical
 * Algorithms 2nd ed., ch. 53). 0° on the terminator; negative in the night.
 */
export function sunAltitudeDeg(p: SelenoPoint, colongitudeDeg: number, subSolarLatDeg: number): number {
  const b0 = subSolarLatDeg * DEG
  const beta = p.lat * DEG
  const s = Math.sin(b0) * Math.sin(beta) + Math.cos(b0) * Math.cos(beta) * Math.sin((colongitudeDeg + p.lon) * DEG)
  return Math.asin(Math.max(-1, Math.min(1, s))) / DEG
}

/**
 * Morning (the Sun rising, the terminator that sweeps west as the Moon waxes) or evening (setting): the
 * Sun's local colongitude c0 + λ lies within 90° of 0° in the morning and of 180° in the evening.
 */
export function terminatorSide(p: SelenoPoint, colongitudeDeg: number): 'morning' | 'evening' {
  return Math.cos((colongitudeDeg + p.lon) * DEG) >= 0 ? 'morning' : 'evening'
}

export interface OnTerminator {
  formation: Formation
  sunAltitudeDeg: number
  side: 'morning' | 'evening'
}

/** A low Sun, up to about 10°, is where relief stands out (common practice among lunar observers). */
export const LOW_SUN_DEG = 10

/** How far a formation's size widens the band, at most: a sea 1500 km across is not "on" the terminator all week. */
export const BAND_REACH_DEG = 5

/**
 * The formations that the terminator crosses or that stand under a low Sun beside it: the Sun's altitude at
 * the centre between −r (the night edge reaching the rim) and LOW_SUN_DEG + r, with r the formation's
 * angular radius up to BAND_REACH_DEG; north to south.
 */
export function formationsOnTerminator(
  formations: readonly Formation[],
  colongitudeDeg: number,
  subSolarLatDeg: number,
  lowSunDeg = LOW_SUN_DEG,
): OnTerminator[] {
  const out: OnTerminator[] = []
  for (const formation of formations) {
    const p = centre(formation)
    const h = sunAltitudeDeg(p, colongitudeDeg, subSolarLatDeg)
    const r = Math.min(BAND_REACH_DEG, angularRadiusDeg(formation))
    if (h >= -r && h <= lowSunDeg + r) out.push({ formation, sunAltitudeDeg: h, side: terminatorSide(p, colongitudeDeg) })
  }
  return out.sort((a, b) => b.formation.latitude - a.formation.latitude || a.formation.longitude - b.formation.longitude)
}
