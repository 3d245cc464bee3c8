export type InstrumentKind = 'naked-eye' | 'binoculars' | 'telescope'
export type InstrumentView = 'upright' | 'inverted' | 'mirrored'

export interface InstrumentFields {
  kind: InstrumentKind
  magnification: number | null
  apertureMm: number | null
  focalLengthMm: number | null
  eyepieceMm: number | null
}

/** A telescope's magnification is its focal length over the eyepiece's (common practice). */
export function effectiveMagnification(i: InstrumentFields): number | null {
  if (i.kind === 'naked-eye') return 1
  if (i.magnification) return i.magnification
  if (i.kind === 'telescope' && i.focalLengthMm && i.eyepieceMm) return i.focalLengthMm / i.eyepieceMm
  return null
}

const round = (x: number) => Math.round(x * 10) / 10

export function describeInstrument(i: InstrumentFields): string {
  if (i.kind === 'naked-eye') return 'Naked eye'
  if (i.kind === 'binoculars') return `Binoculars ${round(i.magnification ?? 0)} × ${round(i.apertureMm ?? 0)}`
  const mag = effectiveMagnification(i)
  const parts = [`Telescope ${round(i.apertureMm ?? 0)} mm`]
  if (i.focalLengthMm) parts.push(`f ${round(i.focalLengthMm)} mm`)
  if (i.eyepieceMm) parts.push(`${round(i.eyepieceMm)} mm eyepiece`)
  if (mag) parts.push(`${Math.round(mag)}×`)
  return parts.join(', ')
}

/** The sketch template's flip for what the instrument does to the image. */
export function templateFlip(view: InstrumentView): 'none' | 'inverted' | 'mirrored' {
  return view === 'upright' ? 'none' : view
}

export const VIEW_LABELS: Record<InstrumentView, string> = {
  upright: 'Upright (eye, binoculars)',
  inverted: 'Turned upside down (straight-through telescope)',
  mirrored: 'Mirrored (telescope with a diagonal)',
}

export const SEEING_LABELS = ['I — perfect', 'II — slight undulations', 'III — moderate', 'IV — poor', 'V — very bad'] as const
export const TRANSPARENCY_LABELS = ['1 — very poor', '2 — poor', '3 — fair', '4 — good', '5 — excellent'] as const
