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
  /** How many database queries built the grid (a fixed number, whatever the class size). */
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

export interface GroupListItem {
  id: string
  name: string
  description: string
  visibility: 'private' | 'listed'
  role: GroupRole
  status: 'active' | 'pending'
  members: number | null
}

export interface GroupSiteView {
  id: string
  name: string
  latitude: number
  longitude: number
  elevation: number
  timeZone: string
}

export interface GroupView {
  id: string
  name: string
  description: string
  visibility: 'private' | 'listed'
  myRole: GroupRole
  reminders: boolean
  members: { id: string, name: string, role: GroupRole, status: 'active' | 'pending' }[]
  sites: GroupSiteView[]
  campaigns: { id: string, title: string, kind: CampaignKind, clockTime: string, first: string | null, last: string | null, nights: number }[]
  joinCode: string | null
  joinApproval: boolean | null
  invitations: { id: string, email: string, expiresAt: string, sentAt: string }[]
}

export interface CampaignCard {
  id: string
  title: string
  groupId: string
  groupName: string
  kind: CampaignKind
  brief: string
  asks: { sketch: boolean, altitude: boolean, azimuth: boolean }
  site: { id: string, name: string, timeZone: string }
  night: { number: number, of: number, localDate: string, clockTime: string, isToday: boolean }
  moon: { altitudeDeg: number, azimuthDeg: number, illuminatedFraction: number }
  loggedObservationId: string | null
  nightsLogged: number
}

export interface CampaignView extends CampaignSummary {
  myRole: GroupRole
  predictions: { localDate: string, at: string, altitudeDeg: number, azimuthDeg: number, illuminatedFraction: number }[]
}

export interface CampaignComment {
  id: string
  localDate: string
  body: string
  at: string
  member: { id: string, name: string }
  author: string
}

export interface ComparisonView {
  campaign: CampaignSummary
  predictions: { localDate: string, at: string, altitudeDeg: number, azimuthDeg: number }[]
  members: ComparisonMember[]
}
