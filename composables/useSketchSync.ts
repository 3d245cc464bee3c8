import { FetchError } from 'ofetch'
import { lunarCircumstances } from '#shared/lunar'
import type { DiskGeometry } from '#shared/lunar'
import type { SketchConflict, SketchDetail, SketchSaved } from '#shared/sketch/api'
import { DISK_RADIUS, SKETCH_SIZE } from '#shared/sketch/frame'
import { stepsBetween } from '#shared/sketch/operations'
import type { DrawingState } from '#shared/sketch/operations'
import { SHAPES_SCHEMA_VERSION } from '#shared/sketch/schema'
import type { LocalCopy, PendingSave } from './useSketchLocal'

const AUTOSAVE_EVERY_MS = 5000
/** Saves wait for a pause in the drawing, so an autosave never cuts into a run of strokes. */
const QUIET_MS = 1500

/** A save kept by an editor from before saves were operations carries no request: it is built afresh. */
function replayable(saved: PendingSave | null | undefined): PendingSave | null {
  return saved?.method && saved.body ? saved : null
}

/** A v4 UUID, also where crypto.randomUUID is missing (pages served over plain http on a club network). */
export function randomUuid(): string {
  if (typeof crypto.randomUUID === 'function') return crypto.randomUUID()
  const b = crypto.getRandomValues(new Uint8Array(16))
  b[6] = (b[6]! & 0x0F) | 0x40
  b[8] = (b[8]! & 0x3F) | 0x80
  const h = Array.from(b, x => x.toString(16).padStart(2, '0')).join('')
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`
}

/**
 * Never lose a stroke: every change is written to IndexedDB at once, a reopened page
 * takes the local copy when it holds edits the server has not confirmed, and saves go to the server on
 * request and every few seconds while online. A save sends only what changed since the drawing the server
 * confirmed (PATCH); the whole drawing goes (PUT) when this device no longer knows that drawing, or the
 * server refused the changes. A refused save that raced another tab turns into a choice for the observer.
 */
export function useSketchSync(id: string) {
  const store = useSketchStore()
  const local = useSketchLocal(id)
  const online = ref(true)
  let pending: LocalCopy['pending'] = null
  /** Set when the server refused a list of changes: the next save sends the whole drawing. */
  let sendWhole = false
  let geometry: { at: string, value: DiskGeometry } | null = null
  let lastEditAt = 0
  let lastAttemptAt = 0
  let tickTimer: ReturnType<typeof setInterval> | undefined
  let saving: Promise<void> | null = null

  async function persist() {
    const detail = store.detail
    if (!detail || !detail.editable) return
    const { shapes: _shapes, ...meta } = detail
    const copy: LocalCopy = { id, detail: meta, ...store.localState(), pending, writtenAt: new Date().toISOString() }
    await local.write(copy).catch(() => undefined)
  }

  let writing: Promise<void> | null = null
  let writeAgain = false

  /**
   * Writes at once (a new stroke is one small record and the list of keys: useSketchLocal); changes made
   * while a write is running are written right after it, in one go.
   */
  function persistSoon() {
    if (writing) {
      writeAgain = true
      return
    }
    writing = persist().finally(() => {
      writing = null
      if (writeAgain) {
        writeAgain = false
        persistSoon()
      }
    })
  }

  /** Opens the sketch from the server's answer and whatever this device still holds. */
  async function open(server: SketchDetail | null): Promise<boolean> {
    const copy = await local.read().catch(() => undefined)
    const unconfirmed = copy && copy.edits !== copy.savedEdit
    if (!server) {
      if (!copy) return false
      store.open({ ...copy.detail, shapes: { schemaVersion: SHAPES_SCHEMA_VERSION, frame: { size: SKETCH_SIZE, diskRadius: DISK_RADIUS }, strokes: [] } }, copy, false)
      pending = replayable(copy.pending)
      store.sync = 'offline'
      return true
    }
    if (server.editable && copy && unconfirmed) {
      store.open(server, copy)
      pending = replayable(copy.pending)
      // The server decides: the save lands, or a 409 shows that another copy moved on.
      store.sync = 'pending'
    }
    else {
      store.open(server)
      store.sync = server.editable ? 'saved' : 'read-only'
    }
    await persist()
    void local.sweep().catch(() => undefined)
    return true
  }

  function sketchGeometry(): DiskGeometry | null {
    const observation = store.detail?.observation
    if (!observation) return null
    if (geometry?.at !== observation.observedAt) {
      geometry = { at: observation.observedAt, value: lunarCircumstances(new Date(observation.observedAt), observation.site) }
    }
    return geometry.value
  }

  /** The next save: the changes since the confirmed drawing, or the whole drawing; null when nothing changed. */
  function nextSave(): PendingSave | null {
    const atEdit = store.edits
    const baseVersion = store.baseVersion
    const target: DrawingState = { strokes: store.strokes, view: { ...store.view } }
    const saveId = randomUuid()
    const geometry = sketchGeometry()
    const steps = store.confirmed && geometry && !sendWhole ? stepsBetween(store.confirmed, target, geometry) : null
    if (steps?.length === 0) {
      // Undone back to what the server holds.
      store.markSaved(baseVersion, atEdit, target)
      return null
    }
    if (steps) return { saveId, baseVersion, atEdit, method: 'PATCH', body: { baseVersion, saveId, steps }, result: target }
    const shapes = { schemaVersion: SHAPES_SCHEMA_VERSION, frame: { size: SKETCH_SIZE, diskRadius: DISK_RADIUS }, strokes: target.strokes }
    return { saveId, baseVersion, atEdit, method: 'PUT', body: { baseVersion, saveId, ...target.view, shapes }, result: target }
  }

  async function send() {
    // A save sent on another base (before a conflict was settled) can no longer land.
    if (pending && pending.baseVersion !== store.baseVersion) pending = null
    pending ??= nextSave()
    const sent = pending
    if (!sent) {
      store.sync = 'saved'
      await persist()
      return
    }
    await persist()
    store.sync = 'saving'
    lastAttemptAt = Date.now()
    try {
      const saved = await $fetch<SketchSaved>(`/api/sketches/${id}`, { method: sent.method, body: sent.body })
      pending = null
      sendWhole = false
      store.markSaved(saved.version, sent.atEdit, sent.result)
      store.sync = store.dirty ? 'pending' : 'saved'
      store.syncMessage = ''
    }
    catch (error) {
      if (error instanceof FetchError && error.statusCode === 409 && error.data?.data?.currentVersion) {
        store.conflictVersion = (error.data.data as SketchConflict).currentVersion
        store.sync = 'conflict'
      }
      else if (error instanceof FetchError && !error.statusCode) {
        store.sync = 'offline'
      }
      else {
        if (error instanceof FetchError && error.statusCode && error.statusCode < 500) {
          // Refused as it stands: it will never land, so the next save sends the whole drawing afresh.
          pending = null
          sendWhole = true
        }
        store.sync = 'error'
        store.syncMessage = apiErrorMessage(error)
      }
    }
    await persist()
  }

  /** Saves now unless a save is running (then that one's result stands). */
  function save(): Promise<void> {
    if (!store.editable || store.sync === 'conflict') return Promise.resolve()
    saving ??= send().finally(() => {
      saving = null
    })
    return saving
  }

  function tick() {
    online.value = navigator.onLine
    if (!store.editable || saving || store.sync === 'conflict' || !store.dirty) return
    if (!online.value) {
      store.sync = 'offline'
      return
    }
    const now = Date.now()
    if (now - lastEditAt < QUIET_MS || now - lastAttemptAt < AUTOSAVE_EVERY_MS) return
    void save()
  }

  /** Conflict: take the version another tab saved, dropping this copy's edits. */
  async function takeServerCopy() {
    const server = await $fetch<SketchDetail>(`/api/sketches/${id}`)
    pending = null
    store.open(server)
    store.sync = 'saved'
    await persist()
  }

  /** Conflict: save this copy on top of the other one, which stays in the revision history. */
  async function keepLocalCopy() {
    if (store.conflictVersion == null) return
    store.rebase(store.conflictVersion)
    pending = null
    store.conflictVersion = null
    store.sync = 'pending'
    await save()
  }

  watch(() => store.edits, () => {
    lastEditAt = Date.now()
    // Opening or reloading a copy also moves the counter; only a real edit makes the copy pending.
    if (store.sync === 'saved' && store.dirty) store.sync = 'pending'
    persistSoon()
  })

  function wentOnline() {
    online.value = true
    lastAttemptAt = 0
    tick()
  }

  function wentOffline() {
    online.value = false
    if (store.dirty && store.editable) store.sync = 'offline'
  }

  onMounted(() => {
    online.value = navigator.onLine
    window.addEventListener('online', wentOnline)
    window.addEventListener('offline', wentOffline)
    tickTimer = setInterval(tick, 1000)
  })
  onBeforeUnmount(() => {
    window.removeEventListener('online', wentOnline)
    window.removeEventListener('offline', wentOffline)
    clearInterval(tickTimer)
    void persist()
  })

  return { online, open, save, takeServerCopy, keepLocalCopy }
}
