import exifr from 'exifr'
import sharp from 'sharp'
import { zonedInstant } from '#shared/observing/clock'

export const PHOTO_MAX_BYTES = 15 * 1024 * 1024
/**
 * Decoding costs time in proportion to pixels, not bytes: a 9 KB PNG can claim 79 megapixels. 50 MP takes
 * the largest phone and camera sensors in common use (48 MP); the header is checked before any decoding.
 */
export const PHOTO_MAX_PIXELS = 50_000_000
const FULL_EDGE = 3000
const THUMB_EDGE = 480
const ACCEPTED = new Set(['jpeg', 'png', 'webp'])

export interface ProcessedPhoto {
  full: Buffer
  thumb: Buffer
  width: number
  height: number
  /** The capture instant from EXIF, or null when the file carries none. */
  exifTakenAt: Date | null
}

export class PhotoRejected extends Error {
  constructor(readonly status: 413 | 415 | 400, message: string) {
    super(message)
  }
}

/**
 * EXIF keeps the camera's clock reading without a zone unless OffsetTimeOriginal is present; without it the
 * reading is taken as the site's local time, which is how a camera set to local time records it.
 */
export async function exifCaptureTime(input: Buffer, timeZone: string): Promise<Date | null> {
  const tags = await exifr.parse(input, { pick: ['DateTimeOriginal', 'CreateDate', 'OffsetTimeOriginal'], reviveValues: false })
    .catch(() => null) as Record<string, string> | null
  const raw = tags?.DateTimeOriginal ?? tags?.CreateDate
  const match = typeof raw === 'string' ? /^(\d{4}):(\d{2}):(\d{2})[ T](\d{2}):(\d{2}):(\d{2})/.exec(raw) : null
  if (!match) return null
  const [, y, mo, d, h, mi, s] = match
  const offset = typeof tags?.OffsetTimeOriginal === 'string' ? /^([+-])(\d{2}):(\d{2})$/.exec(tags.OffsetTimeOriginal) : null
  if (offset) {
    const sign = offset[1] === '-' ? -1 : 1
    const minutes = sign * (Number(offset[2]) * 60 + Number(offset[3]))
    return new Date(Date.UTC(+y!, +mo! - 1, +d!, +h!, +mi!, +s!) - minutes * 60_000)
  }
  try {
    return zonedInstant(`${y}-${mo}-${d}`, `${h}:${mi}:${s}`, timeZone)
  }
  catch {
    return null
  }
}

/**
 * Checks an upload is an image we can read, turns it upright, and re-encodes it without any metadata
 * (sharp writes none unless asked): the camera's GPS position never reaches storage.
 */
export async function processPhoto(input: Buffer, timeZone: string): Promise<ProcessedPhoto> {
  if (input.length > PHOTO_MAX_BYTES) throw new PhotoRejected(413, `Photos are limited to ${PHOTO_MAX_BYTES / 1024 / 1024} MB.`)
  let format: string | undefined
  let pixels = 0
  try {
    // Reads the header only (no limit here, or an oversized image would look unreadable rather than too big).
    const header = await sharp(input, { limitInputPixels: false }).metadata()
    format = header.format
    pixels = (header.width ?? 0) * (header.height ?? 0)
  }
  catch {
    throw new PhotoRejected(415, 'That file is not an image Shadowline can read. Use JPEG, PNG or WebP.')
  }
  if (pixels > PHOTO_MAX_PIXELS) {
    throw new PhotoRejected(413, `That image has ${Math.round(pixels / 1e6)} megapixels; photos are limited to ${PHOTO_MAX_PIXELS / 1e6}.`)
  }
  if (format === 'heif') throw new PhotoRejected(415, 'HEIC photos cannot be decoded here. Export the photo as JPEG and upload that.')
  if (!format || !ACCEPTED.has(format)) throw new PhotoRejected(415, 'Use a JPEG, PNG or WebP photo.')
  const exifTakenAt = await exifCaptureTime(input, timeZone)
  try {
    const upright = sharp(input, { limitInputPixels: PHOTO_MAX_PIXELS }).rotate()
    const { data: full, info } = await upright.clone()
      .resize({ width: FULL_EDGE, height: FULL_EDGE, fit: 'inside', withoutEnlargement: true })
      .webp({ quality: 88 })
      .toBuffer({ resolveWithObject: true })
    const thumb = await upright.clone()
      .resize({ width: THUMB_EDGE, height: THUMB_EDGE, fit: 'inside', withoutEnlargement: true })
      .webp({ quality: 80 })
      .toBuffer()
    return { full, thumb, width: info.width, height: info.height, exifTakenAt }
  }
  catch (error) {
    const message = (error as Error).message
    if (/pixel limit/i.test(message)) throw new PhotoRejected(413, 'That image has too many pixels.')
    throw new PhotoRejected(415, 'The image could not be decoded; it may be damaged or truncated.')
  }
}
