// The guide under the drawing: the disk, its lit part, the terminator, the selenographic grid and the
// direction marks, all in sketch units (y down) for one instant's geometry and one view.

import { positionAngleDirection, selenographicToDisk, terminatorOutline, viewTransform } from '../lunar'
import type { DiskGeometry, DiskPoint, DiskView } from '../lunar'
import { DISK_CENTRE, DISK_RADIUS, diskToSketch } from './frame'
import type { SketchPoint } from './frame'

export interface SketchTemplate {
  centre: SketchPoint
  radius: number
  /** Closed polygon of the lit region, flat x, y. */
  lit: number[]
  /** The terminator from cusp to cusp, flat x, y. */
  terminator: number[]
  /** Unit vector from the centre toward the middle of the bright limb, y down. */
  brightLimb: SketchPoint
  /** Where to put the direction marks, just outside the limb. */
  marks: { north: SketchPoint, east: SketchPoint }
}

function flat(points: DiskPoint[]): number[] {
  return points.flatMap((p) => {
    const s = diskToSketch(p)
    return [s.x, s.y]
  })
}

export function sketchTemplate(geometry: DiskGeometry, view: DiskView): SketchTemplate {
  const outline = terminatorOutline(geometry, view, 180)
  const transform = viewTransform(geometry, view)
  const markAt = (positionAngle: number) => diskToSketch(transform.toView(scaleBy(positionAngleDirection(positionAngle), 1.09)))
  return {
    centre: { x: DISK_CENTRE, y: DISK_CENTRE },
    radius: DISK_RADIUS,
    lit: flat(outline.litPath),
    terminator: flat(outline.terminator),
    brightLimb: { x: outline.brightLimbDir.x, y: -outline.brightLimbDir.y },
    marks: { north: markAt(0), east: markAt(90) },
  }
}

function scaleBy(p: DiskPoint, k: number): DiskPoint {
  return { x: p.x * k, y: p.y * k }
}

/**
 * Parallels and meridians every `stepDeg` on the near side, as polylines in sketch units. A line is cut where
 * it passes behind the limb, so each piece lies on the visible hemisphere.
 */
export function selenographicGrid(geometry: DiskGeometry, view: DiskView, stepDeg = 15, sampleDeg = 2): number[][] {
  const lines: number[][] = []
  const trace = (point: (t: number) => [number, number], from: number, to: number) => {
    let current: number[] = []
    for (let t = from; t <= to + 1e-9; t += sampleDeg) {
      const [lat, lon] = point(Math.min(t, to))
      const disk = selenographicToDisk(lat, lon, geometry, view)
      if (disk) {
        const s = diskToSketch(disk)
        current.push(s.x, s.y)
      }
      else if (current.length) {
        if (current.length >= 4) lines.push(current)
        current = []
      }
    }
    if (current.length >= 4) lines.push(current)
  }
  for (let lat = -90 + stepDeg; lat < 90; lat += stepDeg) trace(lon => [lat, lon], -180, 180)
  for (let lon = -180; lon < 180; lon += stepDeg) trace(lat => [lat, lon], -90, 90)
  return lines
}
