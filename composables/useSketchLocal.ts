import { delMany, get, getMany, keys, set, setMany } from 'idb-keyval'
import type { DiskView } from '#shared/lunar'
import type { SketchDetail } from '#shared/sketch/api'
import type { DrawingState, SketchStep } from '#shared/sketch/operations'
import type { Stroke } from '#shared/sketch/schema'
import { newStrokeId } from '#shared/sketch/strokes'

/**
 * A save as sent. Kept on the device until answered: after a reload or a lost answer it is sent again exactly
 * as it was, with the same id, so it lands once; later edits follow in a save of their own.
 */
export interface PendingSave {
  saveId: string
  baseVersion: number
  atEdit: number
  method: 'PATCH' | 'PUT'
  body: { baseVersion: number, saveId: string, steps: SketchStep[] } | { baseVersion: number, saveId: string, orientation: DiskView['orientation'], flip: DiskView['flip'], shapes: object }
  /** The drawing the server holds once this save lands. */
  result: DrawingState
}

/** What the device keeps of an open sketch. */
export interface LocalCopy {
  id: string
  /** The server's answer when last loaded (without its strokes), so the page can open with no network. */
  detail: Omit<SketchDetail, 'shapes'>
  strokes: readonly Stroke[]
  view: DiskView
  baseVersion: number
  edits: number
  savedEdit: number
  /** The drawing the server holds at `baseVersion` (absent in copies written before saves were operations). */
  confirmed?: DrawingState | null
  /** A save that was sent but not confirmed: retried with the same id, it lands at most once. */
  pending: PendingSave | null
  writtenAt: string
}

/** A drawing as stored: the keys of its strokes, in order. */
interface StoredDrawing {
  strokes: string[]
  view: DiskView
}

/** The record as stored: every stroke is a record of its own, written once, and named here by its key. */
interface StoredCopy extends Omit<LocalCopy, 'strokes' | 'confirmed' | 'pending'> {
  format: 2
  strokes: string[]
  confirmed: StoredDrawing | null
  pending: (Omit<PendingSave, 'result'> & { result: StoredDrawing }) | null
}

/**
 * This device's copy of one sketch in IndexedDB. Each stroke is stored once, under a key of its own, and the
 * sketch's record lists the keys: a new stroke writes one small record and the list, never the whole drawing
 * again, so keeping the copy up to date costs the same at 2,000 strokes as at 20. Strokes are frozen, so the
 * same object always has the same content, and its key is remembered with it.
 */
export function useSketchLocal(sketchId: string) {
  const recordKey = `shadowline.sketch.${sketchId}`
  const strokePrefix = `shadowline.stroke.${sketchId}.`
  const keyOf = new WeakMap<Stroke, string>()
  const written = new Set<string>()
  /** When the copy was last written, as found on opening. */
  let foundWrittenAt = 0

  function keysOf(strokes: readonly Stroke[], fresh: Map<string, Stroke>): string[] {
    return strokes.map((stroke) => {
      let key = keyOf.get(stroke)
      if (!key) {
        key = `${strokePrefix}${stroke.id}.${newStrokeId()}`
        keyOf.set(stroke, key)
      }
      if (!written.has(key)) fresh.set(key, stroke)
      return key
    })
  }

  async function write(copy: LocalCopy): Promise<void> {
    const fresh = new Map<string, Stroke>()
    const drawing = (state: DrawingState): StoredDrawing => ({ strokes: keysOf(state.strokes, fresh), view: state.view })
    const stored: StoredCopy = {
      ...copy,
      format: 2,
      strokes: keysOf(copy.strokes, fresh),
      confirmed: copy.confirmed ? drawing(copy.confirmed) : null,
      pending: copy.pending ? { ...copy.pending, result: drawing(copy.pending.result) } : null,
    }
    // The strokes first, so the record never names a stroke that is not stored. They count as written from
    // the start, so a sweep running meanwhile leaves them alone.
    for (const key of fresh.keys()) written.add(key)
    try {
      if (fresh.size) await setMany([...fresh])
    }
    catch (error) {
      for (const key of fresh.keys()) written.delete(key)
      throw error
    }
    await set(recordKey, stored)
  }

  /** The copy with its strokes, or undefined; a copy written before strokes had records of their own is read as it is. */
  async function read(): Promise<LocalCopy | undefined> {
    const stored = await get<StoredCopy | LocalCopy>(recordKey)
    foundWrittenAt = stored ? Date.parse(stored.writtenAt) || 0 : 0
    if (!stored || !('format' in stored)) return stored
    const wanted = [...new Set([...stored.strokes, ...(stored.confirmed?.strokes ?? []), ...(stored.pending?.result.strokes ?? [])])]
    const found = await getMany<Stroke | undefined>(wanted)
    const byKey = new Map<string, Stroke>()
    wanted.forEach((key, i) => {
      const stroke = found[i]
      if (!stroke) return
      const frozen = Object.freeze(stroke)
      keyOf.set(frozen, key)
      written.add(key)
      byKey.set(key, frozen)
    })
    const strokes = (list: string[]) => list.flatMap(key => byKey.get(key) ?? [])
    // A copy missing a stroke is not to be trusted as a base for changes: it is saved whole instead.
    const complete = (list: string[]) => list.every(key => byKey.has(key))
    return {
      ...stored,
      strokes: strokes(stored.strokes),
      confirmed: stored.confirmed && complete(stored.confirmed.strokes) ? { strokes: strokes(stored.confirmed.strokes), view: stored.confirmed.view } : null,
      pending: stored.pending && complete(stored.pending.result.strokes) ? { ...stored.pending, result: { strokes: strokes(stored.pending.result.strokes), view: stored.pending.result.view } } : null,
    }
  }

  /**
   * Removes the stroke records that an earlier visit left and the copy no longer names (strokes undone,
   * drawings turned since). Records this page has read or written are never touched, and nothing is swept
   * while another tab may be drawing on the same sketch (its copy was written in the last minute).
   */
  async function sweep(): Promise<void> {
    if (Date.now() - foundWrittenAt < 60_000) return
    const all = await keys<string>()
    const unused = all.filter(key => typeof key === 'string' && key.startsWith(strokePrefix) && !written.has(key))
    if (unused.length) await delMany(unused)
  }

  return { read, write, sweep }
}
