// What the sketch routes answer; the editor and the lists read these shapes.

import type { DiskView } from '../lunar'
import type { InstrumentView } from '../observing/instrument'
import type { SketchStatus } from '../review/lifecycle'
import type { SketchShapes } from './schema'

export type { InstrumentView, SketchStatus }

/** Only these may be drawn on; the review lifecycle moves a sketch out of them and back. */
export const EDITABLE_SKETCH_STATUSES: readonly SketchStatus[] = ['draft', 'returned']

export interface SketchObservation {
  id: string
  /** ISO 8601 UTC. */
  observedAt: string
  timeZone: string
  site: { name: string, latitude: number, longitude: number, elevation: number }
  view: InstrumentView
}

export interface SketchDetail {
  id: string
  status: SketchStatus
  version: number
  /** The signed-in user owns the sketch and its status allows drawing. */
  editable: boolean
  owner: { name: string }
  view: DiskView
  shapes: SketchShapes
  hasRaster: boolean
  createdAt: string
  updatedAt: string
  observation: SketchObservation
}

export interface SketchSaved {
  id: string
  version: number
  updatedAt: string
  hasRaster: boolean
}

/** `data` of a 409: another save landed first. */
export interface SketchConflict {
  currentVersion: number
  updatedAt: string
}

export interface SketchListItem {
  id: string
  status: SketchStatus
  version: number
  updatedAt: string
  hasRaster: boolean
  observation: { id: string, observedAt: string, timeZone: string, siteName: string, phaseName: string, illuminatedFraction: number }
}

/**
 * Why a version was kept whole. created: the empty page; saved: a save from before saves were operations;
 * full: a whole-drawing save (a first save, "keep mine" after a conflict); restored: an earlier version brought
 * back; session: the drawing as a session left it; interval: a copy every so often in a long session;
 * submitted: the version sent for review.
 */
export type CheckpointReason = 'created' | 'saved' | 'full' | 'restored' | 'session' | 'interval' | 'submitted'

/** A version kept whole, from which the sketch can be brought back. */
export interface SketchRevisionItem {
  version: number
  createdAt: string
  createdBy: string
  reason: CheckpointReason
  strokes: number
  view: DiskView
}

export interface SketchRevisionList {
  /** The sketch's current version: a restore names it as its base. */
  version: number
  editable: boolean
  checkpoints: SketchRevisionItem[]
}

/** One line per sketch for the observation lists (server/utils/sketches.ts, sketchesForObservations). */
export interface SketchSummary {
  id: string
  status: SketchStatus
  updatedAt: string
  hasRaster: boolean
}
