import type { InjectionKey } from 'vue'
import { diskToSelenographic } from '#shared/lunar'
import type { DiskGeometry } from '#shared/lunar'
import { sketchToDisk, type SketchPoint } from '#shared/sketch/frame'

export interface SketchPin {
  id: string
  latitude: number
  longitude: number
  feature: { id: string, name: string, status: string }
}

export interface OverlayFeature {
  id: string
  name: string
  latitude: number
  longitude: number
}

export interface NearTerminator extends OverlayFeature {
  distanceDeg: number
}

/**
 * The named places of the open sketch: its pins, the confirmed features of the gazetteer that can be shown
 * over it, and a place waiting for its name. Pins live on the server (they are shared data); nothing here is
 * kept beyond the page.
 */
export function useSketchPins(sketchId: string, geometry: Ref<DiskGeometry | null>) {
  const store = useSketchStore()
  const pins = ref<SketchPin[]>([])
  const overlay = ref<OverlayFeature[]>([])
  const nearTerminator = ref<NearTerminator[]>([])
  const overlayVisible = ref(false)
  const pending = ref<SketchPoint | null>(null)
  const message = ref('')
  const base = `/api/sketches/${sketchId}`

  async function load() {
    const [tags, shown] = await Promise.all([
      $fetch<SketchPin[]>(`${base}/tags`).catch(() => []),
      $fetch<{ features: OverlayFeature[], nearTerminator: NearTerminator[] }>(`${base}/overlay`).catch(() => null),
    ])
    pins.value = tags
    overlay.value = shown?.features ?? []
    nearTerminator.value = shown?.nearTerminator ?? []
  }

  /** A tap (or the keyboard's "pin the centre") asks for a name, if the place is on the Moon. */
  function requestAt(at: SketchPoint) {
    message.value = ''
    const disk = sketchToDisk(at)
    if (!geometry.value || !diskToSelenographic(disk.x, disk.y, geometry.value, store.view)) {
      message.value = 'Pins go on the Moon\'s disk: that point is beyond the limb.'
      return
    }
    pending.value = at
  }

  /** Where the waiting pin is on the Moon, for the standard names suggested under it. */
  const pendingPlace = computed(() => {
    if (!pending.value || !geometry.value) return null
    const disk = sketchToDisk(pending.value)
    return diskToSelenographic(disk.x, disk.y, geometry.value, store.view)
  })

  async function name(choice: { featureId: string } | { name: string } | { formationId: string }) {
    if (!pending.value) return
    const disk = sketchToDisk(pending.value)
    const pin = await $fetch<SketchPin>(`${base}/tags`, {
      method: 'POST',
      body: { x: disk.x, y: disk.y, orientation: store.view.orientation, flip: store.view.flip, ...choice },
    })
    pins.value = [...pins.value, pin]
    pending.value = null
  }

  async function remove(pin: SketchPin) {
    const url: string = `${base}/tags/${pin.id}`
    await $fetch(url, { method: 'DELETE' })
    pins.value = pins.value.filter(p => p.id !== pin.id)
  }

  return { pins, overlay, nearTerminator, overlayVisible, pending, pendingPlace, message, load, requestAt, name, remove }
}

export type SketchPins = ReturnType<typeof useSketchPins>
export const SKETCH_PINS: InjectionKey<SketchPins> = Symbol('sketch-pins')
