// The sketch's drawing frame and its link to the lunar module's disk coordinates.
//
// A sketch is drawn on a square of SKETCH_SIZE units; the uploaded raster has one pixel per unit, so the
// client renders it at scale 1. The Moon's disk sits at the centre with radius DISK_RADIUS, leaving a margin
// for the cusps and for notes drawn beside the limb. Sketch units grow to the right and DOWN, like a canvas;
// the lunar module's disk coordinates grow to the right and UP (shared/lunar/disk.ts), so y is negated here
// and nowhere else.

import { viewTransform } from '../lunar'
import type { DiskFlip, DiskGeometry, DiskPoint, DiskView } from '../lunar'

export const SKETCH_SIZE = 2048
export const DISK_RADIUS = 860
export const DISK_CENTRE = SKETCH_SIZE / 2

/**
 * Drawn points may lie anywhere in the frame; turning the view (north-up ↔ zenith-up) rotates them about the
 * centre, which can carry a corner up to SKETCH_SIZE / √2 from it. Stored coordinates therefore range a
 * little beyond the frame.
 */
export const COORDINATE_MIN = -512
export const COORDINATE_MAX = SKETCH_SIZE + 512

/** A point in sketch units, y down. */
export interface SketchPoint {
  x: number
  y: number
}

export function diskToSketch(p: DiskPoint): SketchPoint {
  return { x: DISK_CENTRE + DISK_RADIUS * p.x, y: DISK_CENTRE - DISK_RADIUS * p.y }
}

export function sketchToDisk(p: SketchPoint): DiskPoint {
  return { x: (p.x - DISK_CENTRE) / DISK_RADIUS, y: (DISK_CENTRE - p.y) / DISK_RADIUS }
}

/** How the observation's instrument shows the Moon decides the template's starting flip. */
export function flipForInstrument(view: 'upright' | 'inverted' | 'mirrored'): DiskFlip {
  if (view === 'inverted') return 'inverted'
  if (view === 'mirrored') return 'mirrored'
  return 'none'
}

/** The sketch starts as the sky shows it: zenith up, with the instrument's flip. */
export function defaultSketchView(instrumentView: 'upright' | 'inverted' | 'mirrored'): DiskView {
  return { orientation: 'zenith-up', flip: flipForInstrument(instrumentView) }
}

export function sameView(a: DiskView, b: DiskView): boolean {
  return a.orientation === b.orientation && a.flip === b.flip
}

/**
 * The map that carries a drawing made in view `from` onto view `to`, so the strokes stay on the features they
 * were drawn over when the observer turns the template. Both views are linear maps of the same
 * position-angle frame, so the change is `to ∘ from⁻¹`, applied about the disk's centre.
 */
export function reframer(geometry: DiskGeometry, from: DiskView, to: DiskView): (x: number, y: number) => SketchPoint {
  const source = viewTransform(geometry, from)
  const target = viewTransform(geometry, to)
  return (x, y) => {
    const frame = source.fromView({ x: x - DISK_CENTRE, y: DISK_CENTRE - y })
    const view = target.toView(frame)
    return { x: DISK_CENTRE + view.x, y: DISK_CENTRE - view.y }
  }
}

/** Coordinates are kept to a tenth of a unit (a twentieth of a raster pixel): enough, and short in JSON. */
export function roundCoordinate(value: number): number {
  return Math.round(value * 10) / 10
}

export function roundPressure(value: number): number {
  return Math.round(Math.min(1, Math.max(0, value)) * 100) / 100
}
