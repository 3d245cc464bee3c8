// The uploaded raster: a PNG or WebP of exactly the sketch size passes and comes out as WebP images with no
// metadata; anything else is refused with a 4xx before a single object is stored.

import sharp from 'sharp'
import { describe, expect, it } from 'vitest'
import { SKETCH_THUMBNAIL_SIZES, ingestRaster, prepareRaster, sniffRasterFormat } from '../../server/utils/raster'
import type { ObjectStore } from '../../server/utils/storage'

const SIZE = 2048

function recordingStore() {
  const puts: { key: string, type: string, bytes: number }[] = []
  const store: ObjectStore = {
    bucket: 'test',
    ensureBucket: async () => undefined,
    put: async (key, body, type) => {
      puts.push({ key, type, bytes: body.length })
    },
    get: async () => null,
    remove: async () => undefined,
    list: async () => [],
  }
  return { store, puts }
}

// A disk with a lit crescent, like a sketch: black paper, grey and white shapes.
const drawing = (size: number) => Buffer.from(`<svg xmlns="http://www.w3.org/2000/svg" width="${size}" height="${size}">
  <rect width="100%" height="100%" fill="#000"/>
  <circle cx="${size / 2}" cy="${size / 2}" r="${size * 0.42}" fill="#444"/>
  <path d="M ${size / 2} ${size * 0.08} A ${size * 0.42} ${size * 0.42} 0 0 1 ${size / 2} ${size * 0.92} A ${size * 0.2} ${size * 0.42} 0 0 0 ${size / 2} ${size * 0.08}" fill="#eee"/>
</svg>`)

const png = (size = SIZE) => sharp(drawing(size)).png().toBuffer()

async function statusOf(task: Promise<unknown>): Promise<number> {
  try {
    await task
  }
  catch (error) {
    return (error as { statusCode?: number }).statusCode ?? -1
  }
  return 200
}

describe('a good raster', () => {
  it('turns a PNG of the sketch size into a WebP and 512 and 256 px WebP thumbnails, and stores the three', async () => {
    const { store, puts } = recordingStore()
    const keys = await ingestRaster(store, 'sketches/s1/save1', await png(), SIZE)
    expect(puts.map(p => [p.key, p.type])).toEqual(expect.arrayContaining([
      [keys.raster, 'image/webp'], [keys.large, 'image/webp'], [keys.small, 'image/webp'],
    ]))
    expect(puts).toHaveLength(3)
    const prepared = await prepareRaster(await png(), SIZE)
    for (const [buffer, edge] of [[prepared.full, SIZE], [prepared.large, SKETCH_THUMBNAIL_SIZES.large], [prepared.small, SKETCH_THUMBNAIL_SIZES.small]] as const) {
      const meta = await sharp(buffer).metadata()
      expect(meta.format).toBe('webp')
      expect([meta.width, meta.height]).toEqual([edge, edge])
    }
  })

  it('keeps the drawing: the lit crescent stays bright and the sky black', async () => {
    const { full } = await prepareRaster(await png(), SIZE)
    const { data, info } = await sharp(full).greyscale().raw().toBuffer({ resolveWithObject: true })
    const at = (x: number, y: number) => data[(y * info.width + x) * info.channels]!
    expect(at(10, 10)).toBeLessThan(16)
    expect(at(Math.round(SIZE * 0.85), SIZE / 2)).toBeGreaterThan(200)
  })

  it('accepts a WebP of the sketch size', async () => {
    const webp = await sharp(drawing(SIZE)).webp({ lossless: true }).toBuffer()
    expect(sniffRasterFormat(webp)).toBe('webp')
    expect(await statusOf(prepareRaster(webp, SIZE))).toBe(200)
  })

  it('strips what the uploader wrote into the file', async () => {
    const tagged = await sharp(drawing(SIZE))
      .withExif({ IFD0: { ImageDescription: 'Harrier Hill lay-by', Artist: 'an invented observer' } })
      .png()
      .toBuffer()
    expect((await sharp(tagged).metadata()).exif).toBeDefined()
    const prepared = await prepareRaster(tagged, SIZE)
    for (const buffer of [prepared.full, prepared.large, prepared.small]) {
      const meta = await sharp(buffer).metadata()
      expect(meta.exif).toBeUndefined()
      expect(meta.xmp).toBeUndefined()
      expect(meta.icc).toBeUndefined()
    }
  })
})

describe('a bad raster is refused and nothing is stored', () => {
  const cases: [string, () => Promise<Uint8Array>, number][] = [
    ['a JPEG', () => sharp(drawing(SIZE)).jpeg().toBuffer(), 415],
    ['an SVG', async () => drawing(SIZE), 415],
    ['a GIF', () => sharp(drawing(SIZE)).gif().toBuffer(), 415],
    ['a truncated PNG', async () => {
      const whole = await png()
      return whole.subarray(0, Math.floor(whole.length * 0.6))
    }, 422],
    ['a PNG signature followed by noise', async () => Buffer.concat([(await png()).subarray(0, 8), Buffer.alloc(4000, 7)]), 422],
    ['an oversized PNG (4096²)', () => png(4096), 422],
    ['a PNG of the wrong size (1024²)', () => png(1024), 422],
    ['a PNG that is not square', () => sharp(drawing(SIZE)).resize(SIZE, SIZE / 2, { fit: 'fill' }).png().toBuffer(), 422],
    ['a text file', async () => Buffer.from('first quarter, clear, seeing II\n'), 415],
    ['an empty upload', async () => new Uint8Array(0), 400],
  ]

  it.each(cases)('refuses %s', async (_name, make, status) => {
    const { store, puts } = recordingStore()
    expect(await statusOf(ingestRaster(store, 'sketches/s1/save1', await make(), SIZE))).toBe(status)
    expect(puts).toEqual([])
  })

  it('reads the format from the bytes, not from a name or a declared type', () => {
    expect(sniffRasterFormat(Buffer.from('RIFF\0\0\0\0WAVEfmt '))).toBeNull()
    expect(sniffRasterFormat(Buffer.from([0x89, 0x50, 0x4E, 0x47]))).toBeNull()
  })
})
