import sharp from 'sharp'
import { SKETCH_SIZE } from '../../shared/sketch/frame'
import { emptyShapes } from '../../shared/sketch/schema'
import type { Client } from './app'

/** Starts a sketch of one of the client's observations and saves it once with a blank raster. */
export async function savedSketch(base: string, client: Client, observationId: string): Promise<string> {
  const created = await client.post('/api/sketches', { observationId })
  if (created.status !== 201) throw new Error(`sketch not created: ${created.status} ${JSON.stringify(created.body)}`)
  const raster = await sharp({ create: { width: SKETCH_SIZE, height: SKETCH_SIZE, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } } }).png().toBuffer()
  const form = new FormData()
  form.set('baseVersion', String(created.body.version ?? 1))
  form.set('saveId', crypto.randomUUID())
  form.set('orientation', 'zenith-up')
  form.set('flip', 'none')
  form.set('shapes', JSON.stringify(emptyShapes()))
  form.set('raster', new Blob([new Uint8Array(raster)], { type: 'image/png' }), 'sketch.png')
  const saved = await fetch(`${base}/api/sketches/${created.body.id}`, { method: 'PUT', headers: { cookie: client.cookieHeader(), accept: 'application/json' }, body: form })
  if (saved.status !== 200) throw new Error(`sketch not saved: ${saved.status} ${await saved.text()}`)
  return created.body.id
}
