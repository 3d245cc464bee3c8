import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startEmbeddedS3, type EmbeddedS3 } from '../../server/utils/embedded'
import { createObjectStore, type ObjectStore } from '../../server/utils/storage'

let s3: EmbeddedS3
let store: ObjectStore
const dir = mkdtempSync(join(tmpdir(), 'shadowline-s3-'))

beforeAll(async () => {
  s3 = await startEmbeddedS3(dir, 0)
  store = createObjectStore({
    endpoint: s3.endpoint,
    region: 'us-east-1',
    bucket: 'shadowline-test',
    accessKeyId: 'S3RVER',
    secretAccessKey: 'S3RVER',
    forcePathStyle: true,
  })
  await store.ensureBucket()
})
afterAll(async () => {
  await s3?.close()
  rmSync(dir, { recursive: true, force: true })
})

describe('object storage through the embedded S3', () => {
  it('puts, gets and deletes an object byte for byte', async () => {
    const bytes = Buffer.from(Array.from({ length: 70_000 }, (_, i) => (i * 31) % 256))
    await store.put('sketches/demo/raster.webp', bytes, 'image/webp')
    const back = await store.get('sketches/demo/raster.webp')
    expect(back?.contentType).toBe('image/webp')
    expect(back?.body.equals(bytes)).toBe(true)
    await store.remove('sketches/demo/raster.webp')
    expect(await store.get('sketches/demo/raster.webp')).toBeNull()
  })

  it('answers null for a key that was never stored', async () => {
    expect(await store.get('nothing/here.png')).toBeNull()
  })

  it('creates its bucket once and tolerates being asked again', async () => {
    await store.ensureBucket()
    await store.put('a.txt', Buffer.from('first light'), 'text/plain')
    expect((await store.get('a.txt'))?.body.toString()).toBe('first light')
  })
})
