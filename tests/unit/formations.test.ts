import { describe, expect, it } from 'vitest'
import { FORMATION_RECORDS, REFERENCE_FORMATIONS } from '../../db/data/formations'
import {
  FORMATION_KINDS,
  angularRadiusDeg,
  formationsOnTerminator,
  placeLabels,
  projectFormation,
  suggestFormations,
  sunAltitudeDeg,
  terminatorSide,
  type Formation,
} from '../../shared/features/formations'
import { angularDistance, distanceFromTerminator, subSolarPoint } from '../../shared/features/position'
import { diskToSelenographic, lunarCircumstances, selenographicToDisk, type DiskGeometry, type DiskView } from '../../shared/lunar'

const byName = (name: string): Formation => {
  const found = REFERENCE_FORMATIONS.find(f => f.name === name)
  if (!found) throw new Error(`${name} missing from the reference data`)
  return found
}

const VIEWS: DiskView[] = (['north-up', 'zenith-up'] as const).flatMap(orientation =>
  (['none', 'inverted', 'mirrored'] as const).map(flip => ({ orientation, flip })))

// The mean disk: no libration, axis angle 0, full moon, north up.
const MEAN: DiskGeometry = { illuminatedFraction: 1, brightLimbAngleDeg: 0, parallacticAngleDeg: 0, axisAngleDeg: 0, librationLonDeg: 0, librationLatDeg: 0 }
const NORTH_UP: DiskView = { orientation: 'north-up', flip: 'none' }

describe('the reference data', () => {
  it('holds at least 150 near-side formations with unique names and slugs and sane values', () => {
    expect(REFERENCE_FORMATIONS.length).toBeGreaterThanOrEqual(150)
    expect(new Set(REFERENCE_FORMATIONS.map(f => f.id)).size).toBe(REFERENCE_FORMATIONS.length)
    expect(new Set(FORMATION_RECORDS.map(r => r[0])).size).toBe(FORMATION_RECORDS.length)
    for (const f of REFERENCE_FORMATIONS) {
      expect(FORMATION_KINDS).toContain(f.kind)
      expect(Math.abs(f.latitude)).toBeLessThanOrEqual(90)
      // The near side and its limb zones (libration shows up to about 8° beyond ±90°).
      expect(Math.abs(f.longitude)).toBeLessThanOrEqual(95)
      expect(f.diameterKm).toBeGreaterThan(0)
      expect(f.id).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/)
    }
  })

  it('includes the near side\'s maria and the major bays, lakes and marshes', () => {
    for (const name of ['Oceanus Procellarum', 'Mare Imbrium', 'Mare Serenitatis', 'Mare Tranquillitatis', 'Mare Crisium',
      'Mare Fecunditatis', 'Mare Nectaris', 'Mare Nubium', 'Mare Humorum', 'Mare Frigoris', 'Mare Vaporum', 'Mare Cognitum',
      'Mare Insularum', 'Sinus Iridum', 'Sinus Medii', 'Sinus Aestuum', 'Lacus Somniorum', 'Lacus Mortis', 'Palus Putredinis',
      'Palus Epidemiarum']) {
      expect(byName(name).kind).toMatch(/^(oceanus|mare|sinus|lacus|palus)$/)
    }
  })

  // Expected values: IAU/USGS Gazetteer of Planetary Nomenclature (values from memory), centre latitude and
  // east-positive longitude; tolerance 1°, the tolerance the data file states.
  const GAZETTEER: [string, number, number][] = [
    ['Copernicus', 9.62, -20.08],
    ['Tycho', -43.31, -11.36],
    ['Plato', 51.62, -9.38],
    ['Aristarchus', 23.73, -47.49],
    ['Kepler', 8.12, -38.01],
    ['Grimaldi', -5.2, -68.6],
    ['Langrenus', -8.86, 60.9],
    ['Theophilus', -11.45, 26.28],
    ['Clavius', -58.62, -14.73],
    ['Archimedes', 29.72, -3.99],
    ['Ptolemaeus', -9.16, -1.84],
    ['Posidonius', 31.88, 29.99],
    ['Petavius', -25.3, 60.4],
    ['Mare Crisium', 16.18, 59.1],
  ]
  it.each(GAZETTEER)('places %s within 1° of the Gazetteer (from memory)', (name, lat, lon) => {
    const f = byName(name)
    expect(Math.abs(f.latitude - lat)).toBeLessThanOrEqual(1)
    expect(Math.abs(f.longitude - lon)).toBeLessThanOrEqual(1)
  })

  // Cross-check against the computed disk at the mean libration, full moon, north up. Where a formation sits
  // beside its mare is common practice for every lunar observer (and the first thing a wrong sign breaks).
  it('sets craters on the right side of their maria and limbs on the disk', () => {
    const at = (name: string) => selenographicToDisk(byName(name).latitude, byName(name).longitude, MEAN, NORTH_UP)!
    const imbrium = byName('Mare Imbrium')
    const distance = (a: string, b: Formation) => angularDistance({ lat: byName(a).latitude, lon: byName(a).longitude }, { lat: b.latitude, lon: b.longitude })
    // Copernicus south of Mare Imbrium, outside it.
    expect(at('Copernicus').y).toBeLessThan(at('Mare Imbrium').y)
    expect(distance('Copernicus', imbrium)).toBeGreaterThan(angularRadiusDeg(imbrium) * 0.9)
    // Plato on Imbrium's north shore: north of it, about one radius from its centre.
    expect(at('Plato').y).toBeGreaterThan(at('Mare Imbrium').y)
    expect(distance('Plato', imbrium) / angularRadiusDeg(imbrium)).toBeGreaterThan(0.8)
    expect(distance('Plato', imbrium) / angularRadiusDeg(imbrium)).toBeLessThan(1.3)
    // Tycho in the southern highlands, in no mare.
    expect(at('Tycho').y).toBeLessThan(-0.6)
    for (const sea of REFERENCE_FORMATIONS.filter(f => f.kind === 'mare' || f.kind === 'oceanus')) {
      expect(distance('Tycho', sea)).toBeGreaterThan(angularRadiusDeg(sea))
    }
    // East (toward Mare Crisium) is +x in this view; Grimaldi near the west limb, Langrenus near the east.
    expect(at('Mare Crisium').x).toBeGreaterThan(0.7)
    expect(at('Grimaldi').x).toBeLessThan(-0.9)
    expect(at('Langrenus').x).toBeGreaterThan(0.85)
    // Theophilus, Cyrillus, Catharina run north to south on the north-west shore of Nectaris.
    expect(at('Theophilus').y).toBeGreaterThan(at('Cyrillus').y)
    expect(at('Cyrillus').y).toBeGreaterThan(at('Catharina').y)
    expect(at('Theophilus').x).toBeLessThan(at('Mare Nectaris').x)
    // Aristarchus west of Kepler and north of it; Kepler west of Copernicus.
    expect(at('Aristarchus').x).toBeLessThan(at('Kepler').x)
    expect(at('Aristarchus').y).toBeGreaterThan(at('Kepler').y)
    expect(at('Kepler').x).toBeLessThan(at('Copernicus').x)
  })
})

describe('projecting formations', () => {
  const night = lunarCircumstances(new Date('2026-11-16T18:30:00Z'), { latitude: 52.63, longitude: -1.69, elevation: 95 })

  it('puts each centre where a pin at that place goes, in every view', () => {
    for (const view of VIEWS) {
      for (const name of ['Copernicus', 'Plato', 'Langrenus', 'Tycho']) {
        const f = byName(name)
        const p = projectFormation(f, night, view)!
        const pin = selenographicToDisk(f.latitude, f.longitude, night, view)!
        expect(p.x).toBeCloseTo(pin.x, 12)
        expect(p.y).toBeCloseTo(pin.y, 12)
        const back = diskToSelenographic(p.x, p.y, night, view)!
        expect(back.lat).toBeCloseTo(f.latitude, 6)
        expect(back.lon).toBeCloseTo(f.longitude, 6)
      }
    }
  })

  it('turns with the view: mirrored swaps left and right, inverted turns by 180° (common practice)', () => {
    for (const orientation of ['north-up', 'zenith-up'] as const) {
      const plain = projectFormation(byName('Langrenus'), night, { orientation, flip: 'none' })!
      const mirrored = projectFormation(byName('Langrenus'), night, { orientation, flip: 'mirrored' })!
      const inverted = projectFormation(byName('Langrenus'), night, { orientation, flip: 'inverted' })!
      expect(mirrored.x).toBeCloseTo(-plain.x, 12)
      expect(mirrored.y).toBeCloseTo(plain.y, 12)
      expect(inverted.x).toBeCloseTo(-plain.x, 12)
      expect(inverted.y).toBeCloseTo(-plain.y, 12)
    }
  })

  it('draws the outline as the ellipse that the rim\'s points project onto, foreshortened toward the limb', () => {
    // Points on the rim: the small circle of angular radius r about the centre (spherical destination formula).
    const DEG = Math.PI / 180
    for (const view of VIEWS) {
      for (const name of ['Plato', 'Grimaldi', 'Petavius', 'Mare Crisium']) {
        const f = byName(name)
        const p = projectFormation(f, night, view)!
        const r = angularRadiusDeg(f) * DEG
        const phi1 = f.latitude * DEG
        const cosA = Math.cos(p.angleDeg * DEG)
        const sinA = Math.sin(p.angleDeg * DEG)
        for (let k = 0; k < 12; k++) {
          const bearing = (k * 30) * DEG
          const phi2 = Math.asin(Math.sin(phi1) * Math.cos(r) + Math.cos(phi1) * Math.sin(r) * Math.cos(bearing))
          const lon2 = f.longitude * DEG + Math.atan2(Math.sin(bearing) * Math.sin(r) * Math.cos(phi1), Math.cos(r) - Math.sin(phi1) * Math.sin(phi2))
          const rim = selenographicToDisk(phi2 / DEG, lon2 / DEG, night, view)
          if (!rim) continue
          const dx = rim.x - p.x
          const dy = rim.y - p.y
          const u = (dx * cosA + dy * sinA) / p.radial
          const v = (-dx * sinA + dy * cosA) / p.across
          // Exact for a vanishing radius; Crisium's 9° radius near the limb bends the rim.
          const slack = r > 2 * DEG ? 0.2 : 0.03
          expect(Math.abs(Math.hypot(u, v) - 1)).toBeLessThan(slack)
        }
      }
    }
    expect(projectFormation(byName('Grimaldi'), MEAN, NORTH_UP)!.radial).toBeLessThan(projectFormation(byName('Grimaldi'), MEAN, NORTH_UP)!.across * 0.5)
  })

  it('leaves out formations turned away by libration', () => {
    const turned = { ...MEAN, librationLonDeg: 8 }
    expect(projectFormation(byName('Mare Smythii'), turned, NORTH_UP)).not.toBeNull()
    expect(projectFormation(byName('Mare Smythii'), { ...MEAN, librationLonDeg: -8 }, NORTH_UP)).toBeNull()
  })

  it('labels the largest first, drops those too small for the zoom, and never overlaps two labels', () => {
    const items = REFERENCE_FORMATIONS.map(f => projectFormation(f, MEAN, NORTH_UP)).filter(p => p !== null)
    const toScreen = (scale: number) => (x: number, y: number) => ({ x: 500 + x * scale, y: 500 - y * scale })
    const width = (text: string) => text.length * 7
    const far = placeLabels(items, 400, toScreen(400), width, 14)
    const near = placeLabels(items, 2400, toScreen(2400), width, 14)
    expect(far.length).toBeGreaterThan(10)
    expect(near.length).toBeGreaterThan(far.length)
    expect(far.map(l => l.item.formation.name)).toContain('Oceanus Procellarum')
    expect(far.map(l => l.item.formation.name)).not.toContain('Linné')
    for (const boxes of [far, near]) {
      const overlaps = boxes.flatMap(a => boxes.filter(b => a !== b
        && a.left < b.left + b.width && b.left < a.left + a.width && a.top < b.top + b.height && b.top < a.top + a.height))
      expect(overlaps).toEqual([])
    }
  })
})

describe('suggestions under a pin', () => {
  it('put the formation whose outline holds the point first, the smallest of several, then the near ones', () => {
    const archimedes = byName('Archimedes')
    const names = suggestFormations(REFERENCE_FORMATIONS, { lat: archimedes.latitude, lon: archimedes.longitude }).map(s => s.formation.name)
    expect(names[0]).toBe('Archimedes')
    expect(names[1]).toBe('Mare Imbrium')
    const copernicus = byName('Copernicus')
    expect(suggestFormations(REFERENCE_FORMATIONS, { lat: copernicus.latitude + 0.3, lon: copernicus.longitude })[0]!.formation.name).toBe('Copernicus')
  })

  it('order points outside every outline by their distance from the nearest rim', () => {
    const list: Formation[] = [
      { id: 'a', name: 'A', kind: 'crater', latitude: 0, longitude: 0, diameterKm: 30.3 }, // radius about 0.5°
      { id: 'b', name: 'B', kind: 'crater', latitude: 0, longitude: 3, diameterKm: 60.6 }, // radius about 1°
      { id: 'c', name: 'C', kind: 'crater', latitude: 0, longitude: 10, diameterKm: 30.3 },
    ]
    const s = suggestFormations(list, { lat: 0, lon: 1.4 })
    // 0.9° outside A's rim, 0.6° outside B's: B first; C is far beyond the near margin.
    expect(s.map(x => x.formation.id)).toEqual(['b', 'a'])
    expect(s[0]!.outsideDeg).toBeCloseTo(1.6 - angularRadiusDeg(list[1]!), 6)
  })
})

describe('formations on the terminator', () => {
  // The Sun's altitude worked out independently: 90° minus the angle between the place and the sub-solar
  // point (whose longitude is 90° − c0, Meeus ch. 53), as vectors rather than by the closed formula.
  const independent = (f: Formation, c0: number, b0: number) =>
    90 - angularDistance({ lat: f.latitude, lon: f.longitude }, subSolarPoint(c0, b0))

  it('gives the Sun\'s altitude that the sub-solar point gives, at a few formations and colongitudes', () => {
    for (const [c0, b0] of [[0, 0], [37.5, 1.2], [95, -1.4], [200, 0.8], [300, -0.5]] as const) {
      for (const name of ['Copernicus', 'Plato', 'Tycho', 'Langrenus', 'Grimaldi']) {
        const f = byName(name)
        expect(sunAltitudeDeg({ lat: f.latitude, lon: f.longitude }, c0, b0)).toBeCloseTo(independent(f, c0, b0), 8)
      }
    }
  })

  it('has the Sun at 0° on the terminator (common practice): at c0 = 20° the morning terminator is at 20° W', () => {
    expect(sunAltitudeDeg({ lat: 0, lon: -20 }, 20, 0)).toBeCloseTo(0, 10)
    expect(sunAltitudeDeg({ lat: 35, lon: -20 }, 20, 0)).toBeCloseTo(0, 10)
    expect(distanceFromTerminator({ lat: 0, lon: -20 }, 20, 0)).toBeCloseTo(0, 10)
    expect(terminatorSide({ lat: 0, lon: -15 }, 20)).toBe('morning')
    expect(terminatorSide({ lat: 0, lon: 160 }, 20)).toBe('evening')
  })

  it('just after first quarter lists the craters of the central meridian under a low morning Sun, north to south', () => {
    // c0 near 0° at first quarter: the terminator runs down the central meridian (common practice); at 5° it
    // has moved 5° west, with the Sun risen over Ptolemaeus and its chain.
    const list = formationsOnTerminator(REFERENCE_FORMATIONS, 5, 0)
    const names = list.map(o => o.formation.name)
    for (const name of ['Ptolemaeus', 'Alphonsus', 'Arzachel', 'Hipparchus', 'Albategnius', 'Walter', 'Archimedes']) expect(names).toContain(name)
    expect(names).not.toContain('Langrenus')
    expect(names).not.toContain('Grimaldi')
    for (let i = 1; i < list.length; i++) expect(list[i]!.formation.latitude).toBeLessThanOrEqual(list[i - 1]!.formation.latitude)
    for (const o of list) {
      expect(o.sunAltitudeDeg).toBeCloseTo(independent(o.formation, 5, 0), 8)
      expect(o.side).toBe('morning')
    }
    // Exactly those whose independent altitude is in the band, none missed.
    const expected = REFERENCE_FORMATIONS.filter((f) => {
      const h = independent(f, 5, 0)
      const r = Math.min(5, angularRadiusDeg(f))
      return h >= -r && h <= 10 + r
    })
    expect(list.length).toBe(expected.length)
  })

  it('leaves out a long sea whose centre stands under a high Sun, however far it stretches', () => {
    // At c0 = 40° the Sun stands about 22° over Mare Frigoris' centre (1600 km long, its radius 26°).
    const frigoris = byName('Mare Frigoris')
    expect(independent(frigoris, 40, 0)).toBeGreaterThan(20)
    expect(formationsOnTerminator(REFERENCE_FORMATIONS, 40, 0).map(o => o.formation.name)).not.toContain('Mare Frigoris')
    expect(formationsOnTerminator(REFERENCE_FORMATIONS, 5, 0).map(o => o.formation.name)).toContain('Mare Frigoris')
  })

  it('at last quarter lists the same meridian under an evening Sun', () => {
    const list = formationsOnTerminator(REFERENCE_FORMATIONS, 180, 0)
    const ptolemaeus = list.find(o => o.formation.name === 'Ptolemaeus')!
    expect(ptolemaeus.side).toBe('evening')
    expect(ptolemaeus.sunAltitudeDeg).toBeCloseTo(independent(ptolemaeus.formation, 180, 0), 8)
  })
})
