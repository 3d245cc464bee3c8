import { emptyShapes } from '../../shared/sketch/schema'
import type { Client } from './app'

/** Starts a sketch of one of the client's observations and saves it once, empty, as a whole drawing. */
export async function savedSketch(base: string, client: Client, observationId: string): Promise<string> {
  const created = await client.post('/api/sketches', { observationId })
  if (created.status !== 201) throw new Error(`sketch not created: ${created.status} ${JSON.stringify(created.body)}`)
  const body = { baseVersion: created.body.version ?? 1, saveId: crypto.randomUUID(), orientation: 'zenith-up', flip: 'none', shapes: emptyShapes() }
  const saved = await fetch(`${base}/api/sketches/${created.body.id}`, {
    method: 'PUT',
    headers: { 'cookie': client.cookieHeader(), 'accept': 'application/json', 'content-type': 'application/json' },
    body: JSON.stringify(body),
  })
  if (saved.status !== 200) throw new Error(`sketch not saved: ${saved.status} ${await saved.text()}`)
  return created.body.id
}
