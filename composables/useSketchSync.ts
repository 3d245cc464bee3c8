import { FetchError } from 'ofetch'
import { get as readLocal, set as writeLocal } from 'idb-keyval'
import type { DiskView } from '#shared/lunar'
import type { SketchConflict, SketchDetail, SketchSaved } from '#shared/sketch/api'
import { DISK_RADIUS, SKETCH_SIZE } from '#shared/sketch/frame'
import { SHAPES_SCHEMA_VERSION } from '#shared/sketch/schema'
import type { Stroke } from '#shared/sketch/schema'

/** What the device keeps of an open sketch in IndexedDB, written as it changes. */
interface LocalCopy {
  id: string
  /** The server's answer when last loaded (without its strokes), so the page can open with no network. */
  detail: Omit<SketchDetail, 'shapes'>
  strokes: readonly Stroke[]
  view: DiskView
  baseVersion: number
  edits: number
  savedEdit: number
  /** A save that was sent but not confirmed: retried with the same id, it lands at most once. */
  pending: { saveId: string, atEdit: number, baseVersion: number } | null
  writtenAt: string
}

const AUTOSAVE_EVERY_MS = 5000
/** Saves wait for a pause in the drawing, so an autosave never cuts into a run of strokes. */
const QUIET_MS = 1500

const localKey = (id: string) => `shadowline.sketch.${id}`

function randomUuid(): string {
  if (typeof crypto.randomUUID === 'function') return crypto.randomUUID()
  const b = crypto.getRandomValues(new Uint8Array(16))
  b[6] = (b[6]! & 0x0F) | 0x40
  b[8] = (b[8]! & 0x3F) | 0x80
  const h = Array.from(b, x => x.toString(16).padStart(2, '0')).join('')
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`
}

/**
 * Never lose a stroke: every change is written to IndexedDB at once, a reopened page takes the local copy
 * when it holds edits the server has not confirmed, and saves go to the server on request and every few
 * seconds while online. A refused save that raced another tab turns into a choice for the observer.
 */
export function useSketchSync(id: string) {
  const store = useSketchStore()
  const online = ref(true)
  let pending: LocalCopy['pending'] = null
  let lastEditAt = 0
  let lastAttemptAt = 0
  let writeTimer: ReturnType<typeof setTimeout> | undefined
  let tickTimer: ReturnType<typeof setInterval> | undefined
  let saving: Promise<void> | null = null

  async function persist() {
    const detail = store.detail
    if (!detail || !detail.editable) return
    const { shapes: _shapes, ...meta } = detail
    const copy: LocalCopy = { id, detail: meta, ...store.localState(), pending, writtenAt: new Date().toISOString() }
    await writeLocal(localKey(id), copy).catch(() => undefined)
  }

  function persistSoon() {
    clearTimeout(writeTimer)
    writeTimer = setTimeout(() => void persist(), 150)
  }

  /** Opens the sketch from the server's answer and whatever this device still holds. */
  async function open(server: SketchDetail | null): Promise<boolean> {
    const local = await readLocal<LocalCopy>(localKey(id)).catch(() => undefined)
    const unconfirmed = local && local.edits !== local.savedEdit
    if (!server) {
      if (!local) return false
      store.open({ ...local.detail, shapes: { schemaVersion: SHAPES_SCHEMA_VERSION, frame: { size: SKETCH_SIZE, diskRadius: DISK_RADIUS }, strokes: [] } }, local)
      pending = local.pending
      store.sync = 'offline'
      return true
    }
    if (server.editable && local && unconfirmed) {
      store.open(server, local)
      pending = local.pending
      // The server decides: the save lands, or a 409 shows that another copy moved on.
      store.sync = 'pending'
    }
    else {
      store.open(server)
      store.sync = server.editable ? 'saved' : 'read-only'
    }
    await persist()
    return true
  }

  function shapesJson(strokes: readonly Stroke[]): string {
    return JSON.stringify({ schemaVersion: SHAPES_SCHEMA_VERSION, frame: { size: SKETCH_SIZE, diskRadius: DISK_RADIUS }, strokes })
  }

  async function send() {
    const atEdit = store.edits
    const strokes = store.strokes
    const view = { ...store.view }
    const baseVersion = store.baseVersion
    if (!pending || pending.atEdit !== atEdit || pending.baseVersion !== baseVersion) {
      pending = { saveId: randomUuid(), atEdit, baseVersion }
    }
    await persist()
    store.sync = 'saving'
    lastAttemptAt = Date.now()
    try {
      const form = new FormData()
      form.set('baseVersion', String(baseVersion))
      form.set('saveId', pending.saveId)
      form.set('orientation', view.orientation)
      form.set('flip', view.flip)
      form.set('shapes', shapesJson(strokes))
      form.set('raster', await renderSketchRaster(strokes), 'sketch.png')
      const saved = await $fetch<SketchSaved>(`/api/sketches/${id}`, { method: 'PUT', body: form })
      pending = null
      store.markSaved(saved.version, atEdit)
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
    store.baseVersion = store.conflictVersion
    store.conflictVersion = null
    store.sync = 'pending'
    await save()
  }

  watch(() => store.edits, () => {
    lastEditAt = Date.now()
    if (store.sync === 'saved') store.sync = 'pending'
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
    clearTimeout(writeTimer)
    void persist()
  })

  return { online, open, save, takeServerCopy, keepLocalCopy }
}
