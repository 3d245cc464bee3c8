import { describe, expect, it } from 'vitest'
import sharp from 'sharp'
import { diskToSelenographic, lunationBounds } from '../../shared/lunar'
import { zonedInstant } from '../../shared/observing/clock'
import { computeNight } from '../../shared/observing/night'
import { DISK_CENTRE, DISK_RADIUS, sketchToDisk } from '../../shared/sketch/frame'
import { demoDrawing, demoRaster } from '../../server/utils/demoSketches'

// The demo series: evenings at 18:30 at the invented school field, nights 2–13 of a waxing lunation.
const FIELD = { latitude: 52.634, longitude: -1.692, elevation: 95, timeZone: 'Europe/London' }
const { previousNewMoon } = lunationBounds(new Date('2026-11-20T12:00:00Z'))
const nights = Array.from({ length: 12 }, (_, i) => {
  const day = new Date(previousNewMoon.getTime() + (i + 2) * 86_400_000).toISOString().slice(0, 10)
  return computeNight(zonedInstant(day, '18:30', FIELD.timeZone), FIELD)
}).filter(c => c.altitudeDeg >= 3)

describe('the demo sketches', () => {
  it('pin each named place within a few degrees of the same spot on every night', () => {
    const seen = new Map<string, { lat: number, lon: number }[]>()
    for (const c of nights) {
      for (const place of demoDrawing(c).places) {
        const disk = sketchToDisk(place)
        const s = diskToSelenographic(disk.x, disk.y, c, { orientation: 'zenith-up', flip: 'none' })!
        seen.set(place.name, [...(seen.get(place.name) ?? []), s])
      }
    }
    expect([...seen.values()].filter(v => v.length > 1).length).toBeGreaterThan(0)
    for (const [, where] of seen) {
      for (const s of where) {
        expect(Math.abs(s.lat - where[0]!.lat)).toBeLessThan(3)
        expect(Math.abs(s.lon - where[0]!.lon)).toBeLessThan(3)
      }
    }
  })

  it('match their night\'s phase: the drawn lit area covers the computed lit fraction of the disk', async () => {
    for (const c of nights.filter((_, i) => i % 3 === 0)) {
      const png = await demoRaster(demoDrawing(c).shapes)
      const { data, info } = await sharp(png).ensureAlpha().resize(256, 256).raw().toBuffer({ resolveWithObject: true })
      const scale = info.width / (2 * DISK_CENTRE)
      let inDisk = 0
      let lit = 0
      for (let y = 0; y < info.height; y++) {
        for (let x = 0; x < info.width; x++) {
          const dx = (x + 0.5) / scale - DISK_CENTRE
          const dy = (y + 0.5) / scale - DISK_CENTRE
          if (dx * dx + dy * dy > (DISK_RADIUS * 0.98) ** 2) continue
          inDisk += 1
          const i = (y * info.width + x) * 4
          if (data[i + 3]! > 128 && data[i]! > 150) lit += 1
        }
      }
      // Craters and shading darken a little of the lit area: within 0.08 of the computed fraction.
      expect(Math.abs(lit / inDisk - c.illuminatedFraction)).toBeLessThan(0.08)
    }
  })
})
