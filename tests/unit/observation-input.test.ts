import sharp from 'sharp'
import exifr from 'exifr'
import { describe, expect, it } from 'vitest'
import { ObservationBody } from '../../shared/schemas/observation'
import { SiteBody } from '../../shared/schemas/site'
import { CSV_COLUMNS, observationsCsv } from '../../server/utils/observationCsv'
import { PhotoRejected, exifCaptureTime, processPhoto } from '../../server/utils/photos'
import { computeNight } from '../../shared/observing/night'
import type { ObservationView } from '../../shared/types/observation'

const valid = {
  siteId: '3f0c9a52-6a57-4f0e-9d7e-0d5b8f6c1a11',
  localDate: '2026-11-18',
  localTime: '18:30',
  instrument: { kind: 'binoculars', magnification: 10, apertureMm: 42 },
  view: 'upright',
  seeing: 2,
  clinometerReadingDeg: 60,
  compassBearingDeg: 175,
}

describe('the observation form schema', () => {
  it('accepts what the form sends', () => {
    expect(ObservationBody.safeParse(valid).success).toBe(true)
    expect(ObservationBody.safeParse({ ...valid, instrument: { kind: 'telescope', apertureMm: 114, focalLengthMm: 900, eyepieceMm: 25 } }).success).toBe(true)
  })

  it.each([
    ['seeing 7 (Antoniadi runs I–V)', { seeing: 7 }, 'seeing'],
    ['a negative aperture', { instrument: { kind: 'binoculars', magnification: 10, apertureMm: -42 } }, 'instrument.apertureMm'],
    ['a year beyond the supported range', { localDate: '2201-01-01' }, 'localDate'],
    ['a time that is no time', { localTime: '24:10' }, 'localTime'],
    ['a protractor reading over 180°', { clinometerReadingDeg: 200 }, 'clinometerReadingDeg'],
    ['a telescope without magnification or focal lengths', { instrument: { kind: 'telescope', apertureMm: 100 } }, 'instrument.magnification'],
    ['an unknown instrument', { instrument: { kind: 'periscope' } }, 'instrument.kind'],
    ['a site id that is not one', { siteId: 'field' }, 'siteId'],
  ])('refuses %s', (_what, change, field) => {
    const result = ObservationBody.safeParse({ ...valid, ...change })
    expect(result.success).toBe(false)
    expect(result.error!.issues.map(i => i.path.join('.'))).toContain(field)
  })

  it('refuses sites off the globe and unknown time zones', () => {
    expect(SiteBody.safeParse({ name: 'Field', latitude: 91, longitude: 0 }).success).toBe(false)
    expect(SiteBody.safeParse({ name: 'Field', latitude: 10, longitude: 181 }).success).toBe(false)
    expect(SiteBody.safeParse({ name: 'Field', latitude: 10, longitude: 10, timeZone: 'Moon/Tranquillity' }).success).toBe(false)
    expect(SiteBody.safeParse({ name: 'Field', latitude: 10, longitude: 10, timeZone: 'Asia/Kolkata' }).success).toBe(true)
  })
})

describe('CSV export', () => {
  it('writes one header and quotes notes with commas, quotes and line breaks (RFC 4180)', () => {
    const night = computeNight(new Date('2026-11-18T18:30:00Z'), { latitude: 52.6, longitude: -1.7, elevation: 95, timeZone: 'Europe/London' })
    const row: ObservationView & { latitude: number, longitude: number, elevation: number } = {
      id: 'x',
      observedAt: '2026-11-18T18:30:00.000Z',
      localDate: '2026-11-18',
      localTime: '18:30',
      timeZone: 'Europe/London',
      site: { id: 's', name: 'Field' },
      instrument: { kind: 'naked-eye', magnification: null, apertureMm: null, focalLengthMm: null, eyepieceMm: null },
      instrumentLabel: 'Naked eye',
      magnification: 1,
      view: 'upright',
      seeing: 3,
      transparency: null,
      notes: 'Hazy, then clear\n"Plato" sharp',
      circumstances: night,
      computedWith: 'test',
      altitude: null,
      azimuth: null,
      sketches: [],
      latitude: 52.6,
      longitude: -1.7,
      elevation: 95,
    }
    const csv = observationsCsv([row])
    const [header] = csv.split('\n')
    expect(header!.split(',')).toEqual(CSV_COLUMNS)
    expect(CSV_COLUMNS).toContain('azimuth_residual_deg')
    expect(CSV_COLUMNS).toContain('magnetic_declination_deg')
    expect(csv).toContain('"Hazy, then clear\n""Plato"" sharp"')
  })
})

describe('photo intake', () => {
  const zone = 'Europe/London'

  it('keeps the picture, reads the capture time in the site zone and strips the GPS position', async () => {
    const jpeg = await sharp({ create: { width: 800, height: 600, channels: 3, background: '#223' } })
      .jpeg()
      .withExif({ IFD2: { DateTimeOriginal: '2026:07:15 21:40:05' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '52/1 37/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '1/1 41/1 0/1' } })
      .toBuffer()
    expect((await exifr.gps(jpeg))?.latitude).toBeCloseTo(52.6167, 3)
    const out = await processPhoto(jpeg, zone)
    // 21:40:05 British Summer Time is 20:40:05 UTC.
    expect(out.exifTakenAt?.toISOString()).toBe('2026-07-15T20:40:05.000Z')
    expect(out.width).toBe(800)
    expect(await exifr.gps(out.full).catch(() => undefined)).toBeFalsy()
    expect(await exifr.parse(out.full).catch(() => undefined)).toBeFalsy()
    expect((await sharp(out.thumb).metadata()).width).toBeLessThanOrEqual(480)
  })

  it('uses an explicit EXIF offset when the camera wrote one', async () => {
    const jpeg = await sharp({ create: { width: 64, height: 64, channels: 3, background: '#000' } })
      .jpeg().withExif({ IFD2: { DateTimeOriginal: '2026:11:18 18:40:00', OffsetTimeOriginal: '+02:00' } }).toBuffer()
    expect((await exifCaptureTime(jpeg, zone))?.toISOString()).toBe('2026-11-18T16:40:00.000Z')
  })

  it('accepts a PNG without a capture time', async () => {
    const png = await sharp({ create: { width: 40, height: 30, channels: 4, background: '#fff' } }).png().toBuffer()
    const out = await processPhoto(png, zone)
    expect(out.exifTakenAt).toBeNull()
    expect(out.height).toBe(30)
  })

  it.each([
    ['a text file named .jpg', () => Promise.resolve(Buffer.from('these are my observing notes, not a picture'))],
    ['a truncated JPEG', async () => (await sharp({ create: { width: 400, height: 400, channels: 3, background: '#345' } }).jpeg().toBuffer()).subarray(0, 300)],
    ['an SVG', () => Promise.resolve(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"/>'))],
  ])('refuses %s with 415', async (_what, make) => {
    await expect(processPhoto(await make(), zone)).rejects.toMatchObject({ status: 415 })
  })

  it('refuses a file over the size limit with 413', async () => {
    const big = Buffer.alloc(20 * 1024 * 1024, 1)
    const refusal = await processPhoto(big, zone).catch(e => e)
    expect(refusal).toBeInstanceOf(PhotoRejected)
    expect(refusal.status).toBe(413)
  })
})
