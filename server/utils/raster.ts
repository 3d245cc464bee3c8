import { Path2D as CanvasPath2D, createCanvas } from '@napi-rs/canvas'
import { createError } from 'h3'
import sharp from 'sharp'
import { paintRaster } from '../../shared/sketch/paint'
import type { RasterContext } from '../../shared/sketch/paint'
import type { Stroke } from '../../shared/sketch/schema'
import type { ObjectStore } from './storage'

// Sketch images. The editor's own images are drawn here from the stored shapes (drawRaster); an image made
// elsewhere (the demo's) is checked, decoded once and re-encoded as WebP with two thumbnails, so no metadata
// another encoder wrote survives.

export type RasterFormat = 'png' | 'webp'

export const SKETCH_THUMBNAIL_SIZES = { small: 256, large: 512 } as const

export interface PreparedRaster {
  full: Buffer
  large: Buffer
  small: Buffer
}

export interface RasterKeys {
  raster: string
  large: string
  small: string
}

/** The format by its signature bytes; the part's declared content type is not trusted. */
export function sniffRasterFormat(bytes: Uint8Array): RasterFormat | null {
  const png = [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A]
  if (bytes.length >= 8 && png.every((b, i) => bytes[i] === b)) return 'png'
  const ascii = (from: number, to: number) => String.fromCharCode(...bytes.subarray(from, to))
  if (bytes.length >= 12 && ascii(0, 4) === 'RIFF' && ascii(8, 12) === 'WEBP') return 'webp'
  return null
}

function unreadable(): never {
  throw createError({ status: 422, message: 'The raster could not be read as an image; it may be damaged or cut short.' })
}

/**
 * Checks the upload and produces the stored images. Refuses anything that is not a PNG or WebP (415), of
 * another size or animated (422), or damaged (422); libvips is told the pixel limit before it decodes, so an
 * oversized image is refused from its header without allocating its pixels.
 */
export async function prepareRaster(input: Uint8Array, size: number): Promise<PreparedRaster> {
  if (input.length === 0) throw createError({ status: 400, message: 'The save has no raster image.' })
  const format = sniffRasterFormat(input)
  if (!format) throw createError({ status: 415, message: 'The raster must be a PNG or WebP image.' })
  const options = { limitInputPixels: size * size, failOn: 'error' as const }
  const meta = await sharp(input, options).metadata().catch(unreadable)
  if (meta.format !== format) unreadable()
  if (meta.width !== size || meta.height !== size) {
    throw createError({ status: 422, message: `The raster must be ${size} × ${size} pixels; this one is ${meta.width} × ${meta.height}.` })
  }
  if ((meta.pages ?? 1) > 1) throw createError({ status: 422, message: 'The raster must be a single still image.' })

  const decoded = await sharp(input, options).raw().toBuffer({ resolveWithObject: true }).catch(unreadable)
  const raw = { raw: { width: decoded.info.width, height: decoded.info.height, channels: decoded.info.channels } }
  const thumbnail = (edge: number) => sharp(decoded.data, raw)
    .resize(edge, edge, { kernel: 'lanczos3' })
    .webp({ quality: 82, effort: 4 })
    .toBuffer()
  const [full, large, small] = await Promise.all([
    sharp(decoded.data, raw).webp({ quality: 90, effort: 4 }).toBuffer(),
    thumbnail(SKETCH_THUMBNAIL_SIZES.large),
    thumbnail(SKETCH_THUMBNAIL_SIZES.small),
  ])
  return { full, large, small }
}

/** Writes the three images under a prefix that is new for every save, so no stored image is replaced. */
export async function storeRaster(store: ObjectStore, prefix: string, prepared: PreparedRaster): Promise<RasterKeys> {
  const keys: RasterKeys = {
    raster: `${prefix}/full.webp`,
    large: `${prefix}/thumb-${SKETCH_THUMBNAIL_SIZES.large}.webp`,
    small: `${prefix}/thumb-${SKETCH_THUMBNAIL_SIZES.small}.webp`,
  }
  await Promise.all([
    store.put(keys.raster, prepared.full, 'image/webp'),
    store.put(keys.large, prepared.large, 'image/webp'),
    store.put(keys.small, prepared.small, 'image/webp'),
  ])
  return keys
}

/** Checks, converts and stores an uploaded raster; nothing is written unless every check passes. */
export async function ingestRaster(store: ObjectStore, prefix: string, input: Uint8Array, size: number): Promise<RasterKeys> {
  return storeRaster(store, prefix, await prepareRaster(input, size))
}

/** Removes the images of a save that lost a race; a failure leaves an unreferenced object, nothing worse. */
export async function discardRaster(store: ObjectStore, keys: RasterKeys): Promise<void> {
  await Promise.all(Object.values(keys).map(key => store.remove(key).catch(() => undefined)))
}

// ---- Images drawn on the server from the stored shapes ----

// The shared painter builds its outlines with the global Path2D, which Node lacks; the canvas package's own
// is the one its context fills.
const paths = globalThis as { Path2D?: unknown }
paths.Path2D ??= CanvasPath2D

/**
 * Paints a drawing with the editor's painter (shared/sketch/paint.ts) on a Node canvas and encodes the
 * image and its thumbnails with sharp. Each thumbnail is painted at its own size rather than scaled down,
 * which is quicker than resampling a 2048² image and just as sharp.
 */
export async function drawRaster(strokes: readonly Stroke[], size: number): Promise<PreparedRaster> {
  const [full, large, small] = await Promise.all([
    encodePainted(strokes, size, size, 90),
    encodePainted(strokes, SKETCH_THUMBNAIL_SIZES.large, size, 82),
    encodePainted(strokes, SKETCH_THUMBNAIL_SIZES.small, size, 82),
  ])
  return { full, large, small }
}

/** The drawing at `edge` pixels as RGBA, painted as the browser paints it. */
export function paintPixels(strokes: readonly Stroke[], edge: number, size: number): Buffer {
  const canvas = createCanvas(edge, edge)
  const ctx = canvas.getContext('2d')
  paintRaster(ctx as unknown as RasterContext, strokes, edge, size)
  return Buffer.from(ctx.getImageData(0, 0, edge, edge).data.buffer)
}

function encodePainted(strokes: readonly Stroke[], edge: number, size: number, quality: number): Promise<Buffer> {
  return sharp(paintPixels(strokes, edge, size), { raw: { width: edge, height: edge, channels: 4 } })
    .removeAlpha()
    .webp({ quality, effort: 4 })
    .toBuffer()
}

/** One small image of a drawing, for lists of versions. */
export function drawThumbnail(strokes: readonly Stroke[], edge: number, size: number): Promise<Buffer> {
  return encodePainted(strokes, edge, size, 82)
}
