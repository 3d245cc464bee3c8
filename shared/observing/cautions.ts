// Which cautions a situation calls for. The texts are the usual ones for observing the Moon with optics
// (common practice in observing handbooks and school outreach notes); which of them to show is chosen from
// the numbers of the moment, never from a northern waxing evening taken for granted.

import { SUN_CAUTION_SEPARATION_DEG } from '../lunar'

export type CautionKind
  = | 'sun-up'
    | 'sun-near'
    | 'evening-crescent'
    | 'morning-crescent'
    | 'bright-moon'
    | 'never-at-sun'
    | 'night-outdoors'
    | 'local-rules'

export interface Caution {
  kind: CautionKind
  urgent: boolean
  text: string
}

export interface Situation {
  /** The Sun's altitude (°) at the moment; above −0.833° it is up. */
  sunAltitudeDeg: number
  moonSunSeparationDeg: number
  illuminatedFraction: number
  /** Whether the Moon waxes (new to full). */
  waxing: boolean
  /** Whether the moment is in the evening (Sun in the west, after local noon) rather than the morning. */
  evening: boolean
  /** The instrument's aperture in mm, when known. */
  apertureMm?: number | null
}

// The upper limb on the horizon with standard refraction, as for sunrise and sunset (common practice).
const SUN_UP_DEG = -0.833
// A crescent under about a quarter lit stays within about 60° of the Sun: it sets soon after it in the
// evening, rises shortly before it in the morning (common practice; 25 % lit is about 60° from the Sun).
const THIN_CRESCENT_FRACTION = 0.25
// Over about half lit, and with 100 mm or more of aperture, the Moon dazzles a dark-adapted eye (common
// practice: a neutral density or polarising filter is usual from a gibbous Moon in a 4-inch telescope).
const BRIGHT_FRACTION = 0.5
const LARGE_APERTURE_MM = 100

const TEXTS: Record<CautionKind, string> = {
  'sun-up': 'The Sun is up. Do not aim binoculars or a telescope now: wait until the Sun has set, and keep the Moon well clear of it.',
  'sun-near': `The Moon is within ${SUN_CAUTION_SEPARATION_DEG}° of the Sun. Do not aim binoculars or a telescope at it until the Sun is well below the horizon.`,
  'evening-crescent': 'The thin evening crescent sets soon after the Sun and stands close to it: start only after sunset, and never sweep towards where the Sun went down while the sky is bright.',
  'morning-crescent': 'The thin morning crescent rises shortly before the Sun: finish before sunrise, and stop sweeping towards the brightening east as dawn comes on.',
  'bright-moon': 'A bright Moon in a large aperture can dazzle; a neutral density or polarising filter helps.',
  'never-at-sun': 'Never aim binoculars or a telescope at or near the Sun.',
  'night-outdoors': 'At night outdoors, choose a safe site you know, take care with your footing, dress for the cold, and young observers come with an adult.',
  'local-rules': 'Follow local rules for sites and access, and the instrument maker\'s instructions.',
}

function caution(kind: CautionKind, urgent = false): Caution {
  return { kind, urgent, text: TEXTS[kind] }
}

/** The standing cautions, for pages that do not know the moment (the situational ones, Sun up or near, are left out). */
export function allCautions(): Caution[] {
  return (['never-at-sun', 'night-outdoors', 'evening-crescent', 'morning-crescent', 'bright-moon', 'local-rules'] as const)
    .map(kind => caution(kind))
}

/** The cautions for a situation, urgent ones first. */
export function cautionsFor(s: Situation): Caution[] {
  const list: Caution[] = []
  const sunUp = s.sunAltitudeDeg > SUN_UP_DEG
  if (sunUp) list.push(caution('sun-up', true))
  if (s.moonSunSeparationDeg < SUN_CAUTION_SEPARATION_DEG) list.push(caution('sun-near', true))
  if (!sunUp && s.moonSunSeparationDeg >= SUN_CAUTION_SEPARATION_DEG) list.push(caution('never-at-sun'))
  if (s.illuminatedFraction < THIN_CRESCENT_FRACTION) {
    if (s.waxing && s.evening) list.push(caution('evening-crescent'))
    if (!s.waxing && !s.evening) list.push(caution('morning-crescent'))
  }
  if (s.illuminatedFraction > BRIGHT_FRACTION && (s.apertureMm == null || s.apertureMm >= LARGE_APERTURE_MM)) list.push(caution('bright-moon'))
  if (!sunUp) list.push(caution('night-outdoors'))
  return list
}

/** The situation at a moment from the stored or computed circumstances and the site clock's hour (0–23). */
export function situationOf(
  c: { sunAltitudeDeg: number, moonSunSeparationDeg: number, illuminatedFraction: number, waxing: boolean },
  localHour: number,
  apertureMm?: number | null,
): Situation {
  return { ...c, evening: localHour >= 12, apertureMm }
}
