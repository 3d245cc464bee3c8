// The progress grid's arithmetic and the class comparison, as pure functions so the server, the export and
// the tests share them.

import { estimateConstantOffset } from '../observing/measurements'
import { CELL_STATES, type CellState, type ComparisonMember, type ComparisonReading } from './types'

/** What one observation amounts to: the furthest step the member reached on that night. */
export interface ObservationFacts {
  measurements: number
  sketchStatuses: string[]
}

export function cellState(facts: ObservationFacts | undefined): CellState {
  if (!facts) return 'nothing'
  if (facts.sketchStatuses.includes('approved')) return 'published'
  if (facts.sketchStatuses.includes('submitted')) return 'submitted'
  if (facts.sketchStatuses.length > 0) return 'sketched'
  return facts.measurements > 0 ? 'measured' : 'logged'
}

export function stateRank(state: CellState): number {
  return CELL_STATES.indexOf(state)
}

/**
 * A residual this far from the member's own pattern is worth a look: a misread scale, a wrong night, the
 * wrong side of the compass. 10° is the rule of thumb for a hand compass or protractor clinometer
 * (common practice in class campaigns; a careful reading is within a few degrees).
 */
export const OUTLIER_DEG = 10

export interface MemberReadings {
  member: { id: string, name: string }
  readings: Omit<ComparisonReading, 'correctedDeg' | 'outlier'>[]
}

/**
 * Each member's readings against the prediction: the compass's constant offset is estimated and removed
 * (a steady bias is fine; what matters is the change from night to night), then any reading still more than
 * OUTLIER_DEG away is flagged. Altitude readings have no constant offset removed: a clinometer reads
 * against gravity.
 */
export function compareMembers(members: MemberReadings[]): ComparisonMember[] {
  return members.map(({ member, readings }) => {
    const azimuths = readings.filter(r => r.kind === 'azimuth')
    const altitudes = readings.filter(r => r.kind === 'altitude')
    const offset = estimateConstantOffset(azimuths.map(r => r.residualDeg))
    const compassOffset = offset?.offsetDeg ?? 0
    const out: ComparisonReading[] = readings.map((r) => {
      const correctedDeg = r.kind === 'azimuth' ? r.residualDeg - compassOffset : r.residualDeg
      return { ...r, correctedDeg, outlier: Math.abs(correctedDeg) > OUTLIER_DEG }
    })
    return {
      member,
      readings: out,
      compassOffsetDeg: offset ? offset.offsetDeg : null,
      compassSpreadDeg: offset?.spreadDeg ?? null,
      altitudeMeanResidualDeg: altitudes.length ? altitudes.reduce((s, r) => s + r.residualDeg, 0) / altitudes.length : null,
    }
  })
}
