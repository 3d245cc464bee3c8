// What the campaign pages receive from the server.

export type CampaignKind = 'evening' | 'morning'
export type GroupRole = 'leader' | 'co-leader' | 'member'

/** What a member did on a campaign night, from least to most. */
export const CELL_STATES = ['nothing', 'logged', 'measured', 'sketched', 'submitted', 'published'] as const
export type CellState = (typeof CELL_STATES)[number]

export interface CampaignNight {
  localDate: string
  /** The campaign's clock time on that date, as an instant. */
  at: string
  moonAltitudeDeg: number
  moonAzimuthDeg: number
  illuminatedFraction: number
}

export interface CampaignSummary {
  id: string
  groupId: string
  groupName: string
  title: string
  brief: string
  kind: CampaignKind
  clockTime: string
  site: { id: string, name: string, timeZone: string }
  asks: { sketch: boolean, altitude: boolean, azimuth: boolean }
  nights: string[]
  reminderMinutes: number
}

export interface GridCell {
  state: CellState
  observationId: string | null
  comments: number
}

export interface GridRow {
  member: { id: string, name: string }
  cells: GridCell[]
  /** Nights with anything logged. */
  total: number
}

export interface ProgressGrid {
  campaign: CampaignSummary
  nights: string[]
  rows: GridRow[]
  /** Per night: members who logged anything. */
  nightTotals: number[]
  /** Per night: members at each state or beyond. */
  queries: number
}

export interface ComparisonReading {
  localDate: string
  kind: 'altitude' | 'azimuth'
  measuredDeg: number
  predictedDeg: number
  residualDeg: number
  /** Residual with the member's constant compass offset removed (the altitude's residual as it is). */
  correctedDeg: number
  outlier: boolean
}

export interface ComparisonMember {
  member: { id: string, name: string }
  readings: ComparisonReading[]
  compassOffsetDeg: number | null
  compassSpreadDeg: number | null
  altitudeMeanResidualDeg: number | null
}
