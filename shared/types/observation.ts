import type { DerivedMeasurement } from '../observing/measurements'
import type { StoredCircumstances } from '../observing/night'
import type { InstrumentFields, InstrumentView } from '../observing/instrument'
import type { SketchSummary } from '../sketch/api'

/** One observation as the owner's pages receive it. */
export interface ObservationView {
  id: string
  observedAt: string
  localDate: string
  localTime: string
  timeZone: string
  site: { id: string, name: string }
  instrument: InstrumentFields
  instrumentLabel: string
  magnification: number | null
  view: InstrumentView
  seeing: number | null
  transparency: number | null
  notes: string
  circumstances: StoredCircumstances
  computedWith: string
  altitude: DerivedMeasurement | null
  azimuth: DerivedMeasurement | null
  sketches: SketchSummary[]
}
