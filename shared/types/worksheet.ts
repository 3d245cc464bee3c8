import type { OffsetEstimate } from '../observing/measurements'
import type { PredictedNight } from '../observing/worksheet'
import type { ObservationView } from './observation'

export interface WorksheetView {
  site: { id: string, name: string, latitude: number, longitude: number, elevation: number, timeZone: string }
  sites: { id: string, name: string }[]
  previousNewMoon: string
  nextNewMoon: string
  clockTime: string
  nights: PredictedNight[]
  observations: ObservationView[]
  compassOffset: OffsetEstimate | null
  notes: string[]
}
