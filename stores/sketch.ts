import { defineStore } from 'pinia'
import type { DiskGeometry, DiskView } from '#shared/lunar'
import type { SketchDetail } from '#shared/sketch/api'
import { reframer, sameView } from '#shared/sketch/frame'
import type { DrawingState } from '#shared/sketch/operations'
import type { SketchTool, Stroke } from '#shared/sketch/schema'
import { mapStrokes } from '#shared/sketch/strokes'

/** The drawing tools, moving the view about, and pinning a named place. */
export type EditorTool = SketchTool | 'move' | 'pin'

/** Where the open sketch stands against the server. */
export type SyncState = 'loading' | 'saved' | 'saving' | 'pending' | 'offline' | 'conflict' | 'error' | 'read-only'

interface Snapshot {
  strokes: readonly Stroke[]
  view: DiskView
}

const HISTORY_LIMIT = 200

function frozen(state: DrawingState | null | undefined): DrawingState | null {
  return state ? { strokes: Object.freeze(state.strokes.map(s => Object.freeze(s))), view: { ...state.view } } : null
}

/** The part of the open sketch kept on the device between visits. */
export interface LocalSketchState {
  strokes: readonly Stroke[]
  view: DiskView
  baseVersion: number
  edits: number
  savedEdit: number
  /** The drawing as the server holds it at `baseVersion`; null when this device no longer knows it. */
  confirmed?: DrawingState | null
}

/**
 * Client state of the open sketch: its strokes and view, undo history, tool settings and save state. Strokes
 * are frozen plain objects held in a shallow ref: an edit replaces the list, so Vue never walks the points.
 */
export const useSketchStore = defineStore('sketch', () => {
  const detail = shallowRef<SketchDetail | null>(null)
  const strokes = shallowRef<readonly Stroke[]>([])
  const view = ref<DiskView>({ orientation: 'zenith-up', flip: 'none' })
  /** The server version this copy builds on. */
  const baseVersion = ref(0)
  /** Counts local edits; `savedEdit` is the count the server last confirmed. */
  const edits = ref(0)
  const savedEdit = ref(0)
  /** The drawing the server holds at `baseVersion`: an autosave sends only what differs from it. */
  const confirmed = shallowRef<DrawingState | null>(null)
  const undoStack = shallowRef<Snapshot[]>([])
  const redoStack = shallowRef<Snapshot[]>([])

  const tool = ref<EditorTool>('pencil')
  const tone = ref(1)
  const sizes = ref({ pencil: 8, shade: 90, eraser: 32 })
  const templateVisible = ref(true)
  const templateOpacity = ref(0.7)
  const gridVisible = ref(false)
  const penOnly = ref(false)

  const sync = ref<SyncState>('loading')
  const syncMessage = ref('')
  const conflictVersion = ref<number | null>(null)

  const dirty = computed(() => edits.value !== savedEdit.value)
  const canUndo = computed(() => undoStack.value.length > 0)
  const canRedo = computed(() => redoStack.value.length > 0)
  const editable = computed(() => detail.value?.editable === true)

  function snapshot(): Snapshot {
    return { strokes: strokes.value, view: { ...view.value } }
  }

  function record() {
    undoStack.value = [...undoStack.value, snapshot()].slice(-HISTORY_LIMIT)
    redoStack.value = []
    edits.value += 1
  }

  function restore(to: Snapshot) {
    strokes.value = to.strokes
    view.value = { ...to.view }
    edits.value += 1
  }

  /** Opens a sketch: the server's copy, or a local copy with edits the server has not seen yet. */
  function localState(): LocalSketchState {
    return {
      strokes: strokes.value,
      view: { ...view.value },
      baseVersion: baseVersion.value,
      edits: edits.value,
      savedEdit: savedEdit.value,
      confirmed: confirmed.value,
    }
  }

  /** `fromServer` is false when `server` is this device's note of the sketch, without its strokes. */
  function open(server: SketchDetail, local?: LocalSketchState, fromServer = true) {
    detail.value = server
    const serverState = { strokes: Object.freeze(server.shapes.strokes.map(s => Object.freeze(s))), view: { ...server.view } }
    strokes.value = local ? Object.freeze(local.strokes.map(s => Object.freeze(s))) : serverState.strokes
    view.value = { ...(local?.view ?? server.view) }
    baseVersion.value = local?.baseVersion ?? server.version
    // A local copy keeps the drawing its base version held; one from before it did takes the server's drawing
    // when built on the server's current version, and is otherwise saved whole.
    confirmed.value = !local
      ? serverState
      : frozen(local.confirmed) ?? (fromServer && local.baseVersion === server.version ? serverState : null)
    edits.value = local?.edits ?? 0
    savedEdit.value = local?.savedEdit ?? 0
    undoStack.value = []
    redoStack.value = []
    conflictVersion.value = null
  }

  function addStroke(stroke: Stroke) {
    if (!editable.value) return
    record()
    strokes.value = Object.freeze([...strokes.value, stroke])
  }

  /** Turns the drawing with the template, so every stroke stays over what it was drawn on. */
  function setView(next: DiskView, geometry: DiskGeometry) {
    if (sameView(next, view.value)) return
    if (!editable.value) {
      view.value = { ...next }
      return
    }
    record()
    strokes.value = Object.freeze(mapStrokes(strokes.value, reframer(geometry, view.value, next)))
    view.value = { ...next }
  }

  function clearAll() {
    if (!editable.value || !strokes.value.length) return
    record()
    strokes.value = Object.freeze([])
  }

  function undo() {
    const last = undoStack.value.at(-1)
    if (!last || !editable.value) return
    redoStack.value = [...redoStack.value, snapshot()]
    undoStack.value = undoStack.value.slice(0, -1)
    restore(last)
  }

  function redo() {
    const next = redoStack.value.at(-1)
    if (!next || !editable.value) return
    undoStack.value = [...undoStack.value, snapshot()]
    redoStack.value = redoStack.value.slice(0, -1)
    restore(next)
  }

  /** The server took the copy made at edit `atEdit` as `version`, holding `state`. */
  function markSaved(version: number, atEdit: number, state: DrawingState) {
    baseVersion.value = version
    savedEdit.value = atEdit
    confirmed.value = state
    if (detail.value) detail.value = { ...detail.value, version, hasRaster: true }
  }

  /** Another copy moved on to `version`: this one will be saved whole on top of it. */
  function rebase(version: number) {
    baseVersion.value = version
    confirmed.value = null
  }

  return {
    detail, strokes, view, baseVersion, edits, savedEdit, confirmed, dirty, canUndo, canRedo, editable,
    tool, tone, sizes, templateVisible, templateOpacity, gridVisible, penOnly,
    sync, syncMessage, conflictVersion,
    open, localState, addStroke, setView, clearAll, undo, redo, markSaved, rebase,
  }
})
